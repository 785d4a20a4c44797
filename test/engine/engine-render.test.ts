import { describe, expect, it } from 'vitest';
import { resample } from '../../src/dsp';
import { Curve } from '../../src/dilation';
import { defaultTuning } from '../../src/tuning';
import { peakFrequency, toneLevelDb, rmsLevel } from '../../src/analysis';
import { engineAt, playOne, renderFor, sine, tuningWith } from './engine-helpers';

const SR = 48000;

/** |H(f)| of the Audio EQ Cookbook low-pass (docs/references.md §4a, VERIFIED formulas), evaluated independently here. */
function cookbookLowpassDb(f0: number, q: number, fs: number, f: number): number {
  const w0 = (2 * Math.PI * f0) / fs;
  const alpha = Math.sin(w0) / (2 * q);
  const cw = Math.cos(w0);
  const a0 = 1 + alpha;
  const b = [(1 - cw) / 2 / a0, (1 - cw) / a0, (1 - cw) / 2 / a0];
  const a = [1, (-2 * cw) / a0, (1 - alpha) / a0];
  const w = (2 * Math.PI * f) / fs;
  const re = (c: number[]) => c[0] + c[1] * Math.cos(w) + c[2] * Math.cos(2 * w);
  const im = (c: number[]) => -(c[1] * Math.sin(w) + c[2] * Math.sin(2 * w));
  return 20 * Math.log10(Math.hypot(re(b), im(b)) / Math.hypot(re(a), im(a)));
}

describe('Engine rendering', () => {
  it.each([1, 0.75, 0.5, 1.5, 2.25])('renders one voice at constant ratio %s equal to resample() of its buffer', (ratio) => {
    const x = sine(997, SR, 0.5, 0.3);
    for (let i = 0; i < x.length; i++) x[i] += 0.1 * Math.sin(i * 0.37); // broadband content too
    const { engine } = playOne([x], SR, { group: 'interface', ratio, fadeInSeconds: 0 });
    const [left, right] = renderFor(engine, 0.2, 128);
    const ref = resample(x, ratio);
    let worst = 0;
    for (let i = 0; i < left.length; i++) worst = Math.max(worst, Math.abs(left[i] - ref[i]), Math.abs(right[i] - ref[i]));
    expect(worst).toBeLessThan(1e-6);
  });

  it('includes the sound rate in the ratio: a 24 kHz sound at ratio 1 equals resample at 0.5', () => {
    const x = sine(1000, 24000, 0.5, 0.3);
    const { engine } = playOne([x], 24000, { group: 'interface', fadeInSeconds: 0 });
    const [left] = renderFor(engine, 0.2, 100);
    const ref = resample(x, 0.5);
    let worst = 0;
    for (let i = 0; i < left.length; i++) worst = Math.max(worst, Math.abs(left[i] - ref[i]));
    expect(worst).toBeLessThan(1e-6);
  });

  // Replay at speed V multiplies every frequency by V (scaling theorem, J. O. Smith, SASP, docs/references.md §9, VERIFIED).
  it.each([
    ['effects', 'follow-time', 0.5, 500],
    ['vehicles', 'follow-time', 0.5, 500],
    ['interface', 'exempt', 0.5, 1000],
    ['music', 'tone-only', 0.5, 1000],
    ['interface', 'exempt', 0.1, 1000],
  ])('plays a 1 kHz tone in group %s (%s) at time scale %s at %s Hz ± 0.5 Hz after the ramp', (group, _policy, scale, expected) => {
    const { engine } = playOne([sine(1000, SR, 1)], SR, { group, loop: true });
    engine.setTimeScale({ target: scale, rampSeconds: 0.2, easing: 'smooth' });
    const [left] = renderFor(engine, 1.5);
    const peak = peakFrequency(left.subarray(SR, SR + 16384), SR, { windowShape: 'kaiser' });
    expect(peak).not.toBeNull();
    expect(Math.abs(peak!.frequency - expected)).toBeLessThan(0.5);
  });

  it('keeps a tone-only group at 1 kHz with the level of its curve times the cookbook low-pass at the tuned cutoff', () => {
    const scale = 0.5;
    const music = defaultTuning.groups.music;
    const cutoff = new Curve(music.tone).evaluate(scale);
    const levelDb = new Curve(music.level).evaluate(scale);
    for (const tone of [1000, 6000]) {
      const { engine } = playOne([sine(tone, SR, 1, 0.25)], SR, { group: 'music', loop: true });
      engine.setTimeScale({ target: scale, rampSeconds: 0.1, easing: 'linear' });
      const [left] = renderFor(engine, 1.2);
      const measured = toneLevelDb(left.subarray(SR / 2, SR / 2 + 16384), SR, tone, { windowShape: 'kaiser' });
      const expected = 20 * Math.log10(0.25) + levelDb + cookbookLowpassDb(cutoff, Math.SQRT1_2, SR, tone);
      expect(Math.abs(measured - expected)).toBeLessThan(0.05);
    }
  });

  // Cookbook worked values (docs/references.md §4a): |H(f0)| = Q → −3.0103 dB at Q = 1/√2 (VERIFIED identity);
  // 48 kHz, f0 = 5 kHz: −18.8260 dB at Fs/4, f0 = 1 kHz: −47.3389 dB at Fs/4 (COMPUTED, cross-checked with scipy butter).
  it.each([
    [1000, 1000, -3.0103],
    [5000, 12000, -18.826],
    [1000, 12000, -47.3389],
  ])('filters a tone-only voice with a constant %s Hz cutoff to the cookbook level at %s Hz (%s dB)', (cutoff, tone, db) => {
    const tuning = tuningWith((t) => {
      t.groups.music.tone = { interpolation: 'linear', keys: [{ x: 0, y: cutoff }] };
      t.groups.music.level = { interpolation: 'linear', keys: [{ x: 0, y: 0 }] };
    });
    const { engine } = playOne([sine(tone, SR, 1, 0.25)], SR, { group: 'music', loop: true }, { tuning });
    const [left] = renderFor(engine, 0.8);
    const measured = toneLevelDb(left.subarray(SR / 4, SR / 4 + 16384), SR, tone, { windowShape: 'kaiser' }) - 20 * Math.log10(0.25);
    expect(Math.abs(measured - db)).toBeLessThan(0.05);
  });

  it('freezes a follow-time voice at time scale 0 (silent, read head held) and resumes it with a fade', () => {
    const x = sine(1000, SR, 1);
    const run = (freeze: boolean) => {
      const { engine } = playOne([x], SR, { group: 'effects' });
      let ended = -1;
      let step = 0;
      const [left] = renderFor(engine, 3, 128, (t) => {
        if (freeze && step === 0 && t >= 0.3) engine.setTimeScale({ target: 0, rampSeconds: 0, easing: 'linear', startTime: 0.3 + 0 * step++ });
        if (freeze && step === 1 && t >= 1.3) engine.setTimeScale({ target: 1, rampSeconds: 0, easing: 'linear', startTime: 1.3 + 0 * step++ });
        if (ended < 0 && t > 0 && engine.stats.activeVoices === 0) ended = t;
      });
      return { left, ended, engine };
    };
    const plain = run(false);
    const frozen = run(true);
    expect(rmsLevel(frozen.left, Math.round(0.6 * SR), Math.round(1.25 * SR))).toBe(0);
    const back = peakFrequency(frozen.left.subarray(Math.round(1.5 * SR), Math.round(1.5 * SR) + 8192), SR, { windowShape: 'kaiser' });
    expect(Math.abs(back!.frequency - 1000)).toBeLessThan(0.5);
    // The frozen second is added to the voice's life (up to the glides of the ratio into and out of the freeze).
    expect(frozen.ended - plain.ended).toBeGreaterThan(0.9);
    expect(frozen.ended - plain.ended).toBeLessThan(1.1);
  });

  it('gives the same samples for the same inputs', () => {
    const run = () => {
      const engine = engineAt({ capacity: 8 });
      const a = engine.addSound([sine(220, 44100, 0.7)], 44100);
      const b = engine.addSound([sine(660, SR, 0.3), sine(330, SR, 0.3)], SR);
      return renderFor(engine, 1, 96, (t) => {
        const k = Math.round(t * 1000);
        if (k % 50 === 0) engine.play(k % 100 === 0 ? a : b, { group: k % 200 === 0 ? 'ambience' : 'effects', sourceId: 1, ratio: 0.9 + (k % 7) / 20 });
        engine.pushSnapshot({ time: t, listener: { position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } }, sources: [{ id: 1, position: { x: 30 * t - 10, y: 0, z: -3 } }] });
        if (k === 400) engine.setTimeScale({ target: 0.3, rampSeconds: 0.2, easing: 'exponential' });
      });
    };
    const [l1, r1] = run();
    const [l2, r2] = run();
    expect(rmsLevel(l1)).toBeGreaterThan(0.01);
    expect(l1).toEqual(l2);
    expect(r1).toEqual(r2);
  });
});

describe('Engine snapshots', () => {
  const listener = { position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } };
  const mon = () => [{ voice: 0, sourceId: 0, group: '', ratioCents: 0, dopplerCents: 0, radialSpeed: 0, distance: 0, cutoffHz: 0, gainDb: 0, virtual: false }];

  it('glides a source linearly from the previous snapshot to the latest over their interval', () => {
    // The same-instant model: the monitor shows the snapshot glide itself (propagation would show emission-time distances).
    const engine = engineAt({ maxBlockFrames: 480, tuning: tuningWith((t) => { for (const g of Object.values(t.groups) as any[]) g.motion = 'instant'; }) });
    const s = engine.addSound([sine(300, SR, 1)], SR);
    engine.play(s, { loop: true, sourceId: 9 });
    engine.pushSnapshot({ time: 10, listener, sources: [{ id: 9, position: { x: 0, y: 0, z: -10 } }] });
    engine.pushSnapshot({ time: 10.1, listener, sources: [{ id: 9, position: { x: 0, y: 0, z: -20 } }] });
    const m = mon();
    const distances: number[] = [];
    renderFor(engine, 0.12, 480, () => {
      engine.monitor(m);
      distances.push(m[0].distance);
    });
    // Blocks of 480 frames (10 ms), evaluated at their ends 10, 20, 30 … ms after the second snapshot arrived.
    distances.shift();
    const expected = [11, 12, 13, 14, 15, 16, 17, 18, 19, 20, 20];
    distances.slice(0, expected.length).forEach((d, i) => expect(d).toBeCloseTo(expected[i], 9));
  });
});
