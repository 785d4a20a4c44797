import { describe, expect, it } from 'vitest';
import { pitchErrorStats, trackPitch } from '../../../src/analysis';
import { defaultTuning, type Tuning } from '../../../src/tuning';
import { ExpectedPitch, straightLine } from '../../../runtime/check/expected-pitch';
import { phaseIntegrated } from '../../analysis/signals';

const sampleRate = 48000;

// A straight-line pass rendered synthetically: heard frequency f0·(c)/(c − DF·v·cosθ), the OpenAL 1.1 §3.5.2 form of
// the OpenStax §17.7 moving-source formula with Doppler factor DF (docs/references.md §1a, §1c), phase-integrated.
function passSignal(factor: number) {
  const f0 = 330;
  const c = 343;
  const v = 25;
  const d = 6;
  const t0 = 1.5;
  const heard = (t: number) => {
    const x = v * (t - t0);
    return (f0 * c) / (c - factor * v * (-x / Math.hypot(x, d)));
  };
  return { f0, c, v, d, t0, signal: phaseIntegrated(heard, sampleRate, 3 * sampleRate) };
}

function tuning(factor: number): Tuning {
  return {
    ...defaultTuning,
    air: { ...defaultTuning.air, speedOfSound: 343 },
    doppler: { ...defaultTuning.doppler, factor, smoothingSeconds: 0, maxShiftCents: 2400 },
    smoothing: { ...defaultTuning.smoothing, ratioSeconds: 0 },
  };
}

function check(renderFactor: number, expectFactor: number) {
  const pass = passSignal(renderFactor);
  const track = trackPitch(pass.signal, sampleRate);
  const expected = new ExpectedPitch({
    emittedHz: pass.f0,
    tuning: tuning(expectFactor),
    group: 'effects',
    source: straightLine({ x: -pass.v * pass.t0, y: pass.d, z: 0 }, { x: pass.v, y: 0, z: 0 }),
    listener: straightLine({ x: 0, y: 0, z: 0 }, { x: 0, y: 0, z: 0 }),
    timeScaleAt: () => 1,
    startTime: 0,
  }).frequencies(track.times);
  return pitchErrorStats(expected, track.frequencies);
}

describe('tracker, expectation and statistics together', () => {
  it('passes a straight-line pass whose render matches the expectation, well inside 5 cents', () => {
    // 5 cents: the default tolerance (about the smallest audible shift, docs/references.md §10).
    const stats = check(1, 1);
    expect(stats.excluded).toBe(0);
    expect(stats.maxCents).toBeLessThan(1);
  });

  it('fails a pass rendered with Doppler factor 2 against an expectation with factor 1', () => {
    const stats = check(2, 1);
    expect(stats.medianCents).toBeGreaterThan(5);
    expect(stats.p95Cents).toBeGreaterThan(50);
  });
});
