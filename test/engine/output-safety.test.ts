// Output safety that no tuning can switch off: the limiter's ceiling is reached and held; with the limiter off a
// hard ceiling at 0 dBFS holds and the blast guard mutes a sustained blast or a non-finite mix with a short ramp.
import { describe, expect, it } from 'vitest';
import { BlastGuard, blastGuardDefaults, PeakLimiter } from '../../src/engine';
import { engineAt, renderFor, sine, tuningWith } from './engine-helpers';
import { libsamplerateResample } from '../../bench/resampler-reference';

const SR = 48000;
const db = (x: number) => 20 * Math.log10(x);
const peakOf = (x: Float32Array, from = 0, to = x.length) => {
  let p = 0;
  for (let i = from; i < to; i++) p = Math.max(p, Math.abs(x[i]));
  return p;
};

describe('limiter ceiling', () => {
  // Sample peak of a loud sustained sine after the limiter: within 0.1 dB below the ceiling and never above
  // (instant attack, look-ahead 0; the ceiling is a sample-peak ceiling — docs/hardening.md).
  it.each([
    [-1, 12, 997, 48000],
    [-1, 30, 440, 44100],
    [-0.1, 6, 1000, 48000],
    [-6, 20, 3000, 96000],
    [-24, 40, 100, 22050],
  ])('holds a %s dBFS ceiling within 0.1 dB on a sine %s dB over it (%s Hz at %s Hz)', (ceilingDb, overDb, hz, sr) => {
    const l = new PeakLimiter({ sampleRate: sr, ceilingDb });
    const amp = 10 ** ((ceilingDb + overDb) / 20);
    const a = sine(hz, sr, 0.5, amp);
    const b = a.slice();
    l.process(a, b, 0, a.length);
    const settled = db(peakOf(a, Math.round(0.25 * sr)));
    expect(settled).toBeLessThanOrEqual(ceilingDb + 1e-6);
    expect(settled).toBeGreaterThan(ceilingDb - 0.1);
  });

  // True peak: 4× oversampling as a BS.1770-4 meter does (docs/references.md §19.6), by an outside resampler
  // (libsamplerate-js 2.1.2, SRC_SINC_BEST_QUALITY = converter 0). Ratio 0.25 = four output samples per input sample.
  it.each([440, 997, 5000, 11000, 15000])('keeps the true peak of a sustained %s Hz tone 20 dB over the ceiling within 0.1 dB of −1 dBFS', async (hz) => {
    const l = new PeakLimiter({ sampleRate: SR, ceilingDb: -1 });
    const a = sine(hz, SR, 0.3, 10 ** (19 / 20));
    l.process(a, a.slice(), 0, a.length);
    const up = await libsamplerateResample(a.slice(SR / 5), 0.25, 0);
    const truePeak = db(peakOf(up, 400, up.length - 400));
    expect(truePeak).toBeLessThan(-1 + 0.1);
    expect(truePeak).toBeGreaterThan(-1 - 0.1);
  });

  it('settles the engine output of a +12 dBFS tone at the default −1 dBFS ceiling (not −3)', () => {
    const engine = engineAt();
    const s = engine.addSound([sine(440, SR, 1, 4)], SR);
    engine.play(s, { group: 'interface', loop: true, fadeInSeconds: 0 });
    const [left] = renderFor(engine, 0.5);
    const settled = db(peakOf(left, SR / 4));
    expect(settled).toBeLessThanOrEqual(-1 + 1e-6);
    expect(settled).toBeGreaterThan(-1.1);
  });
});

describe('hard ceiling and blast guard with the limiter off', () => {
  const off = () => tuningWith((t) => (t.master.limiter = false));

  it('never exceeds 0 dBFS and mutes a hostile mix (+60 dBFS) within 20 ms, reporting one blast', () => {
    const engine = engineAt({ tuning: off(), capacity: 64 });
    const s = engine.addSound([sine(220, SR, 1, 1)], SR);
    for (let i = 0; i < 64; i++) engine.play(s, { group: 'interface', loop: true, gain: 16, fadeInSeconds: 0 });
    const [left, right] = renderFor(engine, 1);
    expect(Math.max(peakOf(left), peakOf(right))).toBeLessThanOrEqual(1);
    expect(engine.stats.peakIn).toBeGreaterThan(100); // the mix before the guard: far above full scale
    expect(engine.stats.blasts).toBe(1);
    expect(peakOf(left, Math.round(0.02 * SR))).toBe(0);
  });

  it('lets a loud but plausible mix through (+12 dBFS peaks clip at 0 dBFS, no blast)', () => {
    const engine = engineAt({ tuning: off() });
    const s = engine.addSound([sine(220, SR, 1, 1)], SR);
    for (let i = 0; i < 4; i++) engine.play(s, { group: 'interface', loop: true, fadeInSeconds: 0 });
    const [left] = renderFor(engine, 1);
    expect(engine.stats.blasts).toBe(0);
    expect(peakOf(left, SR / 2)).toBe(1);
  });

  it('mutes on a non-finite sample with a ramp of at most 5 ms, holds, then returns over 50 ms', () => {
    const g = new BlastGuard({ sampleRate: SR });
    const n = SR;
    const l = new Float32Array(n).fill(0.5);
    const r = new Float32Array(n).fill(0.5);
    l[1000] = NaN;
    g.process(l, r, n);
    expect(g.trips).toBe(1);
    expect(g.nonFinite).toBe(1);
    const ramp = Math.round(blastGuardDefaults.muteSeconds * SR);
    // The non-finite sample itself becomes 0; then a linear ramp down (every step at most 0.5/ramp) to silence.
    expect(l[1000]).toBe(0);
    for (let i = 1002; i < 1000 + ramp; i++) expect(Math.abs(l[i] - l[i - 1])).toBeLessThanOrEqual(0.5 / ramp + 1e-7);
    expect(peakOf(l, 1000 + ramp, 1000 + Math.round(blastGuardDefaults.holdSeconds * SR))).toBe(0);
    const back = 1000 + Math.round((blastGuardDefaults.holdSeconds + blastGuardDefaults.returnSeconds) * SR) + 2;
    expect(l[back]).toBeCloseTo(0.5, 6);
    expect(g.muted).toBe(false);
  });

  it('keeps quiet and full-scale signals untouched', () => {
    const g = new BlastGuard({ sampleRate: SR });
    const a = sine(1000, SR, 1, 1);
    const b = a.slice();
    const ref = a.slice();
    g.process(a, b, a.length);
    expect(g.trips).toBe(0);
    expect(a).toEqual(ref);
  });
});
