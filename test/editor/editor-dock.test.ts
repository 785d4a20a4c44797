// The dock's default width: about a fifth of the window, within 300…480 px.
import { describe, expect, it } from 'vitest';
import { defaultDockWidth } from '../../editor/editor-dock';

describe('defaultDockWidth', () => {
  it.each([
    [800, 300],
    [1024, 300],
    [1280, 300],
    [1920, 422],
    [2560, 480],
    [3840, 480],
  ])('gives a %i px window a %i px dock', (w, want) => {
    expect(defaultDockWidth(w)).toBe(want);
  });
});
