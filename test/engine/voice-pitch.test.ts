// The pitch stage: ratio and Doppler smoothed apart in cents by the setTargetAtTime one-pole
// v = target + (v0 − target)·e^(−frames/(τ·rate)) (Web Audio API, AudioParam.setTargetAtTime; docs/references.md §5).
import { describe, expect, it } from 'vitest';
import { VoicePitch, clampRatio } from '../../src/engine/voice-pitch';
import { createVoiceTargets } from '../../src/dilation';
import { MAX_RATIO, MIN_RATIO } from '../../src/dsp';
import { createEmissionSolution, EMISSION_HISTORY, EMISSION_NONE } from '../../src/engine/emission-solver';

const SR = 48000;
const N = 128;

function targets(ratio: number, doppler: number) {
  const t = createVoiceTargets();
  t.ratio = ratio;
  t.doppler = doppler;
  return t;
}

describe('VoicePitch', () => {
  it.each([
    { ratio: 2, doppler: 1 },
    { ratio: 0.5, doppler: 1.25 },
    { ratio: 1.1, doppler: 0.9 },
  ])('without smoothing reaches ratio $ratio in one block (Doppler $doppler)', ({ ratio, doppler }) => {
    const p = new VoicePitch(SR, 0, 0);
    const t = targets(ratio, doppler);
    p.aim(t);
    p.step(t, N);
    expect(p.blockStart).toBe(1);
    expect(p.current).toBe(ratio);
  });

  it('starts at its target after a jump, and the next block starts where the last one ended', () => {
    const p = new VoicePitch(SR, 0.05, 0);
    const t = targets(0.5, 1);
    p.aim(t);
    p.jump(t);
    expect(p.current).toBe(0.5);
    p.step(t, N);
    expect(p.blockStart).toBe(0.5);
    expect(p.current).toBe(0.5);
  });

  it.each([0.01, 0.05, 0.2])('glides an octave up with τ = %s s as the one-pole closed form in cents', (tau) => {
    const p = new VoicePitch(SR, tau, 0);
    const t = targets(1, 1);
    p.aim(t);
    p.jump(t);
    t.ratio = 2;
    p.aim(t);
    p.step(t, N);
    const cents = 1200 + (0 - 1200) * Math.exp(-N / (tau * SR)); // closed form of setTargetAtTime
    expect(p.current).toBeCloseTo(Math.pow(2, cents / 1200), 12);
  });

  it.each([
    [1e-9, MIN_RATIO],
    [1e9, MAX_RATIO],
    [1, 1],
  ])('clamps ratio %s to %s', (r, want) => {
    expect(clampRatio(r)).toBe(want);
  });

  it('follows the emission-time Doppler factor from the last block end, a fresh voice from the solution at its start', () => {
    const p = new VoicePitch(SR, 0, 0);
    const pre = createEmissionSolution();
    const sol = createEmissionSolution();
    pre.state = sol.state = EMISSION_HISTORY;
    pre.doppler = 1.1;
    sol.doppler = 1.2;
    sol.meanDoppler = 1.15;
    p.followEmission(pre, sol, true);
    expect([p.dopplerStart, p.dopplerEnd, p.dopplerMean]).toEqual([1.1, 1.2, 1.15]);
    sol.doppler = 1.3;
    p.followEmission(pre, sol, false);
    expect([p.dopplerStart, p.dopplerEnd]).toEqual([1.2, 1.3]);
    sol.state = EMISSION_NONE;
    sol.doppler = 9;
    p.followEmission(pre, sol, false);
    expect(p.dopplerEnd).toBe(1.3);
    p.loseEmission();
    expect([p.dopplerStart, p.dopplerEnd]).toEqual([1.3, 1]);
    expect(p.dopplerMean).toBeNaN();
  });
});
