import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { defaultTuning, parseTuning, serializeTuning } from '../../src/tuning';

function tuningExample(): string {
  const readme = readFileSync(resolve(__dirname, '../../docs/tuning-format.md'), 'utf8');
  const section = readme.slice(readme.indexOf('## Tuning file'));
  const m = /```json\n([\s\S]*?)```/.exec(section);
  if (!m) throw new Error('docs/tuning-format.md has no JSON example in "Tuning file"');
  return m[1];
}

describe('docs/tuning-format.md "Tuning file" example', () => {
  it('parses, keeps its settings and fills the omitted sections from the built-in tuning', () => {
    const t = parseTuning(tuningExample());
    expect(t.doppler.velocityClock).toBe('game');
    expect(t.timeFlow.slowMotionScale).toBe(0.25);
    expect(Object.keys(t.groups)).toEqual(['effects', 'interface']);
    expect(t.distance).toEqual(defaultTuning.distance);
    expect(t.master).toEqual(defaultTuning.master);
    expect(parseTuning(serializeTuning(t))).toEqual(t);
  });
});
