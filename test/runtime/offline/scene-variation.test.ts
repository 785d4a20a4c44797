// Per-play variation in scene scripts: seeded, so the same script renders the same samples offline, and pitched
// within the script's cents range (measured with the pitch tracker).
import { describe, expect, it } from 'vitest';
import { renderScene, ScriptError } from '../../../runtime/offline';
import { trackPitch } from '../../../src/analysis';

const script = (seed: number | undefined, pitchRange: [number, number]) => ({
  version: 1,
  duration: 1.2,
  sampleRate: 48000,
  ...(seed === undefined ? {} : { seed }),
  sounds: { tone: { type: 'tone', frequency: 440, seconds: 0.3 } },
  sources: {},
  voices: [0, 0.4, 0.8].map((start) => ({ sound: 'tone', group: 'interface', start, pitchRange, gainRange: [-6, 0] })),
});

function pitches(left: Float32Array): number[] {
  const track = trackPitch(left, 48000, { hopSeconds: 0.02, minHz: 300, maxHz: 700 });
  return [0.15, 0.55, 0.95].map((t) => track.frequencies[track.times.findIndex((x) => x >= t)]);
}

describe('scene script per-play variation', () => {
  it('renders the same samples for the same seed, and other pitches for another seed', () => {
    const a = renderScene(script(5, [-300, 300]));
    const b = renderScene(script(5, [-300, 300]));
    const c = renderScene(script(6, [-300, 300]));
    expect(Array.from(a.left)).toEqual(Array.from(b.left));
    expect(pitches(a.left)).not.toEqual(pitches(c.left));
  });

  it('keeps every one-shot within its cents range of the 440 Hz tone (pitch tracker)', () => {
    for (const seed of [1, 2, 3]) {
      for (const f of pitches(renderScene(script(seed, [-200, 100])).left)) {
        const cents = 1200 * Math.log2(f / 440);
        expect(cents).toBeGreaterThan(-200 - 5);
        expect(cents).toBeLessThan(100 + 5);
      }
    }
  });

  it('refuses a reversed range and a fractional seed by JSON path', () => {
    expect(() => renderScene(script(1.5, [100, -100]))).toThrow(ScriptError);
    try {
      renderScene(script(1.5, [100, -100]));
    } catch (e) {
      const paths = (e as ScriptError).issues.map((i) => i.path);
      expect(paths).toEqual(expect.arrayContaining(['seed', 'voices[0].pitchRange.high']));
    }
  });
});
