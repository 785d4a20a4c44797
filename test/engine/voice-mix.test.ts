// The mix stage: adds x[i]·(g0 + dg·(i + 1)) into the bus (a linear per-sample ramp, closed form) and reports a
// non-finite input.
import { describe, expect, it } from 'vitest';
import { mixBlock } from '../../src/engine/voice-mix';
import { VoiceGain } from '../../src/engine/voice-gain';
import { createVoiceTargets } from '../../src/dilation';
import { VoiceEnvelope } from '../../src/engine/voice-envelope';

const N = 16;
const full = new VoiceEnvelope(48000);
full.begin(0, 0.01);

function gainRamp(from: number, to: number): VoiceGain {
  const g = new VoiceGain(48000, 0);
  const t = createVoiceTargets();
  t.gain = from;
  g.aim(t);
  g.jump();
  t.gain = to;
  g.aim(t);
  g.step(N);
  g.ramp(full, N);
  return g;
}

describe('mixBlock', () => {
  it.each([
    { from: 1, to: 1 },
    { from: 0.5, to: 1 },
    { from: 1, to: 0.25 },
  ])('adds the block ramped from gain $from to $to onto what the bus holds', ({ from, to }) => {
    const x0 = Float32Array.from({ length: N }, (_, i) => 0.1 * (i + 1));
    const x1 = Float32Array.from({ length: N }, (_, i) => -0.05 * i);
    const mixL = new Float32Array(N + 4).fill(0.25);
    const mixR = new Float32Array(N + 4);
    expect(mixBlock(x0, x1, mixL, mixR, 4, N, gainRamp(from, to), null)).toBe(true);
    for (let i = 0; i < N; i++) {
      const g = from + ((to - from) * (i + 1)) / N;
      expect(mixL[4 + i]).toBeCloseTo(0.25 + x0[i] * g, 6);
      expect(mixR[4 + i]).toBeCloseTo(x1[i] * g, 6);
    }
    expect(mixL[0]).toBe(0.25);
  });

  it.each([NaN, Infinity])('reports a %s input', (bad) => {
    const x = new Float32Array(N);
    x[3] = bad;
    expect(mixBlock(x, x, new Float32Array(N), new Float32Array(N), 0, N, gainRamp(1, 1), null)).toBe(false);
  });
});
