// The mix stage: adds x[i]·(g0 + dg·(i + 1)) into the bus (a linear per-sample ramp, closed form) and reports a
// non-finite input.
import { describe, expect, it } from 'vitest';
import { mixBlock } from '../../src/engine/voice-mix';
import { VoiceGain } from '../../src/engine/voice-gain';
import { createVoiceTargets } from '../../src/dilation';
import { VoiceEnvelope } from '../../src/engine/voice-envelope';
import { VoiceTone } from '../../src/engine/voice-tone';
import { WasmKernel } from '../../src/dsp';

const N = 16;
const full = new VoiceEnvelope(48000);
full.begin(0, 0.01);

function gainRamp(from: number, to: number, frames = N): VoiceGain {
  const g = new VoiceGain(48000, 0);
  const t = createVoiceTargets();
  t.gain = from;
  g.aim(t);
  g.jump();
  t.gain = to;
  g.aim(t);
  g.step(frames);
  g.ramp(full, frames);
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

  const kernel = WasmKernel.shared();

  it.runIf(kernel !== null)("filters a tone stage's staged low-pass and mixes in one pass to the bits of filtering, then mixing", () => {
    // Reference: the TypeScript tone stage (its low-pass checked in test/engine/voice-tone.test.ts) and the TypeScript
    // mix above, one after the other, on copies of the same blocks and bus; a NaN in the last block is reported.
    const k = kernel!;
    const F = 128;
    const at = k.allocFloats(4 * F);
    const view = (q: number) => new Float32Array(k.f32.buffer, at + 4 * F * q, F);
    const bits = (x: Float32Array) => Array.from(new Uint32Array(x.buffer, x.byteOffset, x.length));
    const fused = new VoiceTone(48000, 0.01);
    const apart = new VoiceTone(48000, 0.01);
    const dry = [new Float32Array(F), new Float32Array(F)];
    const refL = new Float32Array(F);
    const refR = new Float32Array(F);
    view(2).fill(0);
    view(3).fill(0);
    const cutoffs = [900, 900, 2500, 2500, 2500, 600];
    for (let b = 0; b < cutoffs.length; b++) {
      const x = [view(0), view(1)];
      for (let i = 0; i < F; i++) {
        x[0][i] = 0.6 * Math.sin((2 * Math.PI * 440 * (b * F + i)) / 48000);
        x[1][i] = 0.4 * Math.sin((2 * Math.PI * 7000 * (b * F + i)) / 48000);
      }
      if (b === cutoffs.length - 1) x[0][17] = NaN;
      const y = [Float32Array.from(x[0]), Float32Array.from(x[1])];
      for (const t of [fused, apart]) t.aim({ cutoffHz: cutoffs[b] });
      if (b === 0) for (const t of [fused, apart]) t.jump();
      const gain = gainRamp(0.3 + 0.1 * b, 0.35 + 0.1 * b, F);
      fused.process(x, dry, F, k, true);
      if (b > 0) expect(fused.pendingIn()).toBe(fused); // engaged from the first block: no crossfade after it
      const okFused = mixBlock(x[0], x[1], view(2), view(3), 0, F, gain, k, fused.pendingIn());
      apart.process(y, dry, F);
      const okApart = mixBlock(y[0], y[1], refL, refR, 0, F, gain, null);
      expect(okFused).toBe(okApart);
      expect(okFused).toBe(b !== cutoffs.length - 1);
      expect(fused.pendingIn()).toBe(null);
      expect(bits(x[0])).toEqual(bits(y[0]));
      expect(bits(x[1])).toEqual(bits(y[1]));
      expect(bits(view(2))).toEqual(bits(refL));
      expect(bits(view(3))).toEqual(bits(refR));
    }
    k.release(at, 16 * F);
  });

  it.runIf(kernel !== null)('leaves nothing staged for the mix when a block takes two module calls (over four sub-blocks)', () => {
    // Reference: the TypeScript tone stage on a copy of the same 200-frame block.
    const k = kernel!;
    const F = 200;
    const at = k.allocFloats(2 * F);
    const x = [new Float32Array(k.f32.buffer, at, F), new Float32Array(k.f32.buffer, at + 4 * F, F)];
    for (let i = 0; i < F; i++) {
      x[0][i] = Math.sin(0.05 * i);
      x[1][i] = Math.cos(0.07 * i);
    }
    const y = [Float32Array.from(x[0]), Float32Array.from(x[1])];
    const dry = [new Float32Array(F), new Float32Array(F)];
    const staged = new VoiceTone(48000, 0.01);
    const ts = new VoiceTone(48000, 0.01);
    for (const t of [staged, ts]) {
      t.aim({ cutoffHz: 1200 });
      t.jump();
    }
    staged.process(x, dry, F, k, true);
    ts.process(y, dry, F);
    expect(staged.pendingIn()).toBe(null);
    expect(Array.from(x[0])).toEqual(Array.from(y[0]));
    expect(Array.from(x[1])).toEqual(Array.from(y[1]));
    k.release(at, 8 * F);
  });
});
