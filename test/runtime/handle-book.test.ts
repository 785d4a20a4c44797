// HandleBook: the worklet host's main-thread ↔ engine handles, forgotten where the handles end.
import { describe, expect, it } from 'vitest';
import { HandleBook } from '../../runtime/worklet/handle-book';

describe('HandleBook', () => {
  it('maps sounds and hands back the old engine id when a sound is replaced or removed', () => {
    const b = new HandleBook();
    b.bindSound(5, 0);
    expect(b.soundOf(5)).toBe(0);
    expect(b.unbindSound(5)).toBe(0);
    expect(b.soundOf(5)).toBeUndefined();
    expect(b.unbindSound(5)).toBeUndefined();
    expect(b.soundCount).toBe(0);
  });

  it('maps voices both ways and forgets both directions when the engine voice ends', () => {
    const b = new HandleBook();
    b.bindVoice(42, 2049);
    expect(b.voiceOf(42)).toBe(2049);
    expect(b.ownerOf(2049)).toBe(42);
    expect(b.endVoice(2049)).toBe(42);
    expect(b.voiceOf(42)).toBeUndefined();
    expect(b.ownerOf(2049)).toBeUndefined();
    expect(b.endVoice(2049)).toBeUndefined();
    expect(b.voiceCount).toBe(0);
  });

  it('replaces an older mapping of either handle, leaving no stale reverse entry', () => {
    const b = new HandleBook();
    b.bindVoice(1, 100);
    b.bindVoice(1, 200); // main voice 1 re-played
    expect(b.ownerOf(100)).toBeUndefined();
    b.bindVoice(2, 200); // engine handle 200 reused for main voice 2
    expect(b.voiceOf(1)).toBeUndefined();
    expect(b.voiceOf(2)).toBe(200);
    expect(b.voiceCount).toBe(1);
  });

  it('sweeps the voices the engine says have ended, reporting each main-thread voice once', () => {
    const b = new HandleBook();
    for (let i = 0; i < 6; i++) b.bindVoice(i, 1000 + i);
    const ended: number[] = [];
    expect(b.sweep((v) => v % 2 === 0, (m) => ended.push(m))).toBe(3);
    expect(ended).toEqual([0, 2, 4]);
    expect([...b.mappedVoices.keys()]).toEqual([1, 3, 5]);
    b.clear();
    expect(b.voiceCount + b.soundCount).toBe(0);
  });
});
