// The other motion models and the time-scale ramp, heard through the engine: 'instant' against OpenAL 1.1 §3.5.2
// (docs/references.md §1c), 'off', and a designed time-scale ramp (smoothstep, common practice) heard on its curve.
import { describe, expect, it } from 'vitest';
import { PitchTracker } from '../../src/analysis';
import { Engine } from '../../src/engine';
import { absQuantile, line, pitchErrors, renderScene, tone } from './propagation-helpers';
import { tuningWith } from './engine-helpers';

const SR = 48000;
const F0 = 400;
const withMotion = (motion: string, extra: (t: Record<string, any>) => void = () => {}) =>
  tuningWith((t) => {
    for (const g of Object.values(t.groups) as Record<string, unknown>[]) g.motion = motion;
    t.air.speedOfSound = 343.3;
    extra(t);
  });

function trackedFrom(x: Float32Array, from: number, to: number): number[] {
  const tr = new PitchTracker({ sampleRate: SR, minHz: 100, maxHz: 2000, hopSeconds: 0.01, windowSeconds: 0.03 }).track(x);
  const f: number[] = [];
  for (let i = 0; i < tr.times.length; i++) if (tr.times[i] >= from && tr.times[i] <= to && tr.periodicities[i] > 0.95) f.push(tr.frequencies[i]);
  return f;
}

describe('motion models other than propagation', () => {
  it('instant: a source approaching at 30 m/s is heard at the OpenAL 1.1 §3.5.2 ratio 1.0957548675 within 0.5 cents', () => {
    const { out } = renderScene({
      source: line([0, 0, -100], [0, 0, 30]), listener: line([0, 0, 0], [0, 0, 0]), seconds: 1, exactVelocities: true,
      sound: tone(F0, 12000, 1), soundRate: 12000, tuning: withMotion('instant'),
    });
    // docs/references.md §1c, first vector case (COMPUTED from the spec's formula): SS 343.3, DF 1, vss = 30.
    const expected = F0 * 1.0957548675;
    const f = trackedFrom(out, 0.5, 0.95);
    expect(f.length).toBeGreaterThan(30);
    for (const x of f) expect(Math.abs(1200 * Math.log2(x / expected))).toBeLessThanOrEqual(0.5);
  });

  it('off: a positioned voice plays at once and unshifted', () => {
    const { out } = renderScene({
      source: line([0, 0, -100], [0, 0, 30]), listener: line([0, 0, 0], [0, 0, 0]), seconds: 0.6, exactVelocities: true,
      sound: tone(F0, 12000, 1), soundRate: 12000, tuning: withMotion('off'),
    });
    let first = -1;
    for (let i = 0; i < out.length && first < 0; i++) if (Math.abs(out[i]) > 1e-6) first = i;
    expect(first).toBeLessThan(SR * 0.003); // no 0.29 s propagation delay
    for (const x of trackedFrom(out, 0.1, 0.5)) expect(Math.abs(1200 * Math.log2(x / F0))).toBeLessThanOrEqual(0.5);
  });
});

describe('time-scale ramps (default tuning)', () => {
  it('hears a 0.25 s smooth ramp from 1 to 0.35 within 5 cents of the designed curve, corners included', () => {
    const engine = new Engine({ sampleRate: SR });
    const sound = engine.addSound([tone(F0, 12000, 1)], 12000);
    engine.play(sound, { loop: true, fadeInSeconds: 0 });
    engine.setTimeScale({ target: 0.35, rampSeconds: 0.25, easing: 'smooth', startTime: 0.2 });
    const n = SR * 0.7;
    const out = new Float32Array(n);
    const l = new Float32Array(128);
    const r = new Float32Array(128);
    for (let o = 0; o < n; o += 128) {
      engine.render([l, r], 128);
      for (let i = 0; i < 128 && o + i < n; i++) out[o + i] = l[i] + r[i];
    }
    // The designed curve: s(t) = 1 + (0.35 − 1)·u²(3 − 2u), u = (t − 0.2)/0.25 (smoothstep, common practice); the
    // effects group's pitch is s itself, so the phase heard is f0·∫s dt — integrated here in fine steps.
    const s = (t: number) => {
      const u = Math.min(1, Math.max(0, (t - 0.2) / 0.25));
      return 1 + (0.35 - 1) * u * u * (3 - 2 * u);
    };
    const phase = new Float64Array(n + 1);
    for (let i = 0; i < n; i++) phase[i + 1] = phase[i] + s((i + 0.5) / SR) / SR;
    const reference = new Float32Array(n);
    for (let i = 0; i < n; i++) reference[i] = 0.3 * Math.sin(2 * Math.PI * F0 * phase[i]);
    const errs = pitchErrors(out, reference, SR, 0.95, 0.05);
    expect(errs.length).toBeGreaterThan(100);
    expect(absQuantile(errs, 1)).toBeLessThanOrEqual(5);
  });
});
