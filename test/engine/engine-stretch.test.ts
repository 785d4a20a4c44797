// The 'stretch' group policy in the engine: pitch kept (or shifted by its curve) while the voice slows with the
// time scale, durations, freezing at time scale 0 (hold or silence), glides without clicks, Doppler on top.
import { describe, expect, it } from 'vitest';
import { trackPitch } from '../../src/analysis';
import { engineAt, renderFor, sine, tuningWith, maxStep } from './engine-helpers';

const SR = 48000;
const F0 = 220;

/** Median tracked pitch (Hz) of x[from…to). */
function medianPitch(x: Float32Array, from: number, to: number): number {
  const tr = trackPitch(x.subarray(from, to), SR, { minHz: 60, maxHz: 1000 });
  const f = Array.from(tr.frequencies).filter((v) => Number.isFinite(v)).sort((a, b) => a - b);
  return f[f.length >> 1];
}

function rms(x: Float32Array, from: number, to: number): number {
  let e = 0;
  for (let i = from; i < to; i++) e += x[i] * x[i];
  return Math.sqrt(e / Math.max(1, to - from));
}

const cents = (a: number, b: number): number => 1200 * Math.log2(a / b);

/** The default tuning with 'music' as a stretch group whose speed follows the time scale. */
function stretchTuning(extra: Record<string, unknown> = {}) {
  return tuningWith((t) => {
    Object.assign(t.groups.music, { policy: 'stretch', pitch: { interpolation: 'linear', keys: [{ x: 0, y: 0 }, { x: 4, y: 4 }] }, level: { interpolation: 'linear', keys: [{ x: 0, y: 0 }] }, tone: { interpolation: 'linear', keys: [{ x: 0, y: 20000 }] } }, extra);
  });
}

describe("engine: 'stretch' groups", () => {
  it.each([
    ['music', 'stretch (pitch kept)', 0],
    ['effects', 'tape-style', -1200],
  ])('at time scale 0.5 a %s voice (%s) sounds %s cents from its source', (group, _kind, expectedCents) => {
    const engine = engineAt({ tuning: stretchTuning() });
    engine.setTimeScale({ target: 0.5, rampSeconds: 0, easing: 'linear' });
    const sound = engine.addSound([sine(F0, SR, 1)], SR);
    engine.play(sound, { group, loop: true });
    const [l] = renderFor(engine, 0.6);
    // ±5 cents for end-to-end pitch-tracker checks: docs/references.md §10; the octave drop of tape-style is §9.
    expect(Math.abs(cents(medianPitch(l, 0.1 * SR, 0.6 * SR), F0) - (expectedCents as number))).toBeLessThanOrEqual(5);
  });

  it('shifts the pitch by the stretchPitch curve (−600 cents at every time scale)', () => {
    const engine = engineAt({ tuning: stretchTuning({ stretchPitch: { interpolation: 'linear', keys: [{ x: 0, y: -600 }] } }) });
    engine.setTimeScale({ target: 0.5, rampSeconds: 0, easing: 'linear' });
    engine.play(engine.addSound([sine(F0, SR, 1)], SR), { group: 'music', loop: true });
    const [l] = renderFor(engine, 0.6);
    expect(Math.abs(cents(medianPitch(l, 0.1 * SR, 0.6 * SR), F0) + 600)).toBeLessThanOrEqual(5);
  });

  it('plays a 0.5 s one-shot for 1 s at time scale 0.5 (within 0.5 %, between its −6 dB points)', () => {
    const engine = engineAt({ tuning: stretchTuning() });
    engine.setTimeScale({ target: 0.5, rampSeconds: 0, easing: 'linear' });
    // 50 ms raised-cosine ends (longer than a grain): the −6 dB points then mark its length on both sides.
    const x = sine(F0, SR, 0.5);
    const edge = 0.05 * SR;
    for (let i = 0; i < edge; i++) {
      const g = 0.5 - 0.5 * Math.cos((Math.PI * i) / edge);
      x[i] *= g;
      x[x.length - 1 - i] *= g;
    }
    engine.play(engine.addSound([x], SR), { group: 'music', fadeInSeconds: 0 });
    const [l] = renderFor(engine, 1.2);
    let first = -1;
    let last = 0;
    for (let i = 0; i < l.length; i++) {
      if (Math.abs(l[i]) > 0.2) {
        if (first < 0) first = i;
        last = i;
      }
    }
    expect(Math.abs((last - first) / (x.length - 0.05 * SR) - 2)).toBeLessThanOrEqual(0.01);
    expect(engine.stats.activeVoices).toBe(0);
  });

  it.each([
    ['hold', true],
    ['silence', false],
  ])('at time scale 0 with stretchFreeze %s it keeps sounding: %s; it resumes when time flows', (mode, sounds) => {
    const engine = engineAt({ tuning: stretchTuning({ stretchFreeze: mode }) });
    engine.play(engine.addSound([sine(F0, SR, 1)], SR), { group: 'music', loop: true });
    renderFor(engine, 0.1);
    engine.setTimeScale({ target: 0, rampSeconds: 0.05, easing: 'linear' });
    const [frozen] = renderFor(engine, 0.4);
    const held = rms(frozen, 0.3 * SR, 0.4 * SR);
    if (sounds) {
      expect(held).toBeGreaterThan(0.4 * Math.SQRT1_2 * 0.5);
      expect(Math.abs(cents(medianPitch(frozen, 0.2 * SR, 0.4 * SR), F0))).toBeLessThanOrEqual(5);
    } else expect(held).toBeLessThan(1e-4);
    engine.setTimeScale({ target: 1, rampSeconds: 0.05, easing: 'linear' });
    const [back] = renderFor(engine, 0.3);
    expect(rms(back, 0.2 * SR, 0.3 * SR)).toBeGreaterThan(0.4 * Math.SQRT1_2 * 0.9);
  });

  it('glides 1 → 0.25 → 1 with every sample step under the sine-slope bound and the level kept', () => {
    const engine = engineAt({ tuning: stretchTuning() });
    engine.play(engine.addSound([sine(F0, SR, 1)], SR), { group: 'music', loop: true });
    const [a] = renderFor(engine, 0.2);
    engine.setTimeScale({ target: 0.25, rampSeconds: 0.5, easing: 'smooth' });
    const [b] = renderFor(engine, 1);
    engine.setTimeScale({ target: 1, rampSeconds: 0.5, easing: 'smooth' });
    const [c] = renderFor(engine, 1);
    // Largest step of A·sin(2π f t) is A·2π f / fs (common practice bound, 5 % margin, as test/dsp/stream-reader.test.ts).
    const bound = 0.4 * ((2 * Math.PI * F0) / SR) * 1.05;
    for (const x of [a, b, c]) expect(maxStep(x, 0.01 * SR)).toBeLessThanOrEqual(bound);
    // Level: 10 ms RMS windows stay within 1 dB of the sine's RMS through the glides.
    const w = 0.01 * SR;
    for (const x of [b, c]) for (let o = 0; o + w <= x.length; o += w) expect(Math.abs(20 * Math.log10(rms(x, o, o + w) / (0.4 * Math.SQRT1_2)))).toBeLessThanOrEqual(1);
  });

  it('adds the Doppler shift on top of the kept pitch (source approaching at 20 m/s)', () => {
    const engine = engineAt({ tuning: stretchTuning({ doppler: true }) });
    engine.setTimeScale({ target: 0.5, rampSeconds: 0, easing: 'linear' });
    const listener = { position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } };
    const snap = (t: number) => engine.pushSnapshot({ time: t, listener, sources: [{ id: 1, position: { x: 0, y: 0, z: -10 }, velocity: { x: 0, y: 0, z: 20 } }] });
    snap(0);
    engine.play(engine.addSound([sine(F0, SR, 1)], SR), { group: 'music', loop: true, sourceId: 1 });
    const [l] = renderFor(engine, 0.6, 128, (t) => snap(t));
    // Moving source, still listener: f' = f·c/(c − v) (docs/references.md §1), c = 331.3·√(1 + 20/273.15) m/s (§2).
    const c = 331.3 * Math.sqrt(1 + 20 / 273.15);
    expect(Math.abs(cents(medianPitch(l, 0.2 * SR, 0.6 * SR), F0) - cents(c / (c - 20), 1))).toBeLessThanOrEqual(5);
  });
});
