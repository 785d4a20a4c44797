// The tone stage: bypassed (bit-exact) when open; engaged, the RBJ cookbook low-pass at Q = 1/√2, which is the
// prewarped bilinear Butterworth: |H|² = 1 / (1 + (tan(πf/fs) / tan(πfc/fs))⁴) (docs/references.md §4).
import { describe, expect, it } from 'vitest';
import { VoiceTone, TONE_Q, TONE_SUB_BLOCK } from '../../src/engine/voice-tone';
import { BiquadLowpass, WasmKernel } from '../../src/dsp';
import { OPEN_CUTOFF_HZ } from '../../src/tuning';

const SR = 48000;
const N = 128;

function sineBlocks(tone: VoiceTone, hz: number, blocks: number): number {
  const x = [new Float32Array(N), new Float32Array(N)];
  const dry = [new Float32Array(N), new Float32Array(N)];
  let peak = 0;
  for (let b = 0; b < blocks; b++) {
    for (let i = 0; i < N; i++) x[0][i] = x[1][i] = Math.sin((2 * Math.PI * hz * (b * N + i)) / SR);
    tone.process(x, dry, N);
    if (b >= blocks / 2) for (let i = 0; i < N; i++) peak = Math.max(peak, Math.abs(x[0][i]));
  }
  return peak;
}

describe('VoiceTone', () => {
  it('leaves the signal untouched while the cutoff is open', () => {
    const tone = new VoiceTone(SR, 0.02);
    tone.aim({ cutoffHz: OPEN_CUTOFF_HZ });
    tone.jump();
    const x = [Float32Array.from({ length: N }, (_, i) => Math.sin(i))];
    const copy = Float32Array.from(x[0]);
    tone.process(x, [new Float32Array(N)], N);
    expect(tone.wet).toBe(false);
    expect(x[0]).toEqual(copy);
  });

  it.each([
    { fc: 1000, f: 4000 },
    { fc: 2000, f: 500 },
    { fc: 4000, f: 4000 },
  ])('at cutoff $fc Hz passes $f Hz at the Butterworth magnitude', ({ fc, f }) => {
    const tone = new VoiceTone(SR, 0);
    tone.aim({ cutoffHz: fc });
    tone.jump();
    const want = 1 / Math.sqrt(1 + Math.pow(Math.tan((Math.PI * f) / SR) / Math.tan((Math.PI * fc) / SR), 4));
    expect(tone.wet).toBe(true);
    expect(sineBlocks(tone, f, 40)).toBeCloseTo(want, 2);
  });

  it('once an opened cutoff has arrived, crossfades from filtered to dry over one block', () => {
    const tone = new VoiceTone(SR, 0);
    tone.aim({ cutoffHz: 1000 });
    tone.jump();
    sineBlocks(tone, 200, 4);
    tone.aim({ cutoffHz: OPEN_CUTOFF_HZ });
    const x = [new Float32Array(N).fill(1)];
    tone.process(x, [new Float32Array(N)], N); // the cutoff glides open, still filtered
    expect(tone.wet).toBe(true);
    x[0].fill(1);
    tone.process(x, [new Float32Array(N)], N);
    expect(tone.wet).toBe(false);
    expect(x[0][N - 1]).toBeCloseTo(1, 6); // the last sample is all dry
    expect(tone.currentCutoff).toBe(OPEN_CUTOFF_HZ);
  });

  it('gives the samples of a low-pass redesigned every sub-block, also while the cutoff rests (the design is reused)', () => {
    // Reference: the cutoff smoothed per sub-block by the setTargetAtTime formula v = T + (v − T)·e^(−n/(τ·fs)) (Web
    // Audio API, docs/references.md §5), snapped to T within 1e-4 (log2 Hz), and the cookbook low-pass (§4a) designed
    // afresh for 2^v every sub-block.
    const tau = 0.002;
    const tone = new VoiceTone(SR, tau);
    const ref = new BiquadLowpass({ channels: 2 });
    const targets = [2000, 500, 500, 500, 500, 500, 500, 500, 3000, 3000];
    let v = 0;
    const x = [new Float32Array(N), new Float32Array(N)];
    for (let b = 0; b < targets.length; b++) {
      const t = Math.log2(targets[b]);
      tone.aim({ cutoffHz: targets[b] });
      if (b === 0) {
        tone.jump();
        v = t;
      }
      for (let i = 0; i < N; i++) {
        x[0][i] = Math.sin((2 * Math.PI * 700 * (b * N + i)) / SR);
        x[1][i] = Math.sin((2 * Math.PI * 5100 * (b * N + i)) / SR);
      }
      const want = [Float32Array.from(x[0]), Float32Array.from(x[1])];
      for (let off = 0; off < N; off += TONE_SUB_BLOCK) {
        v = t + (v - t) * Math.exp(-TONE_SUB_BLOCK / (tau * SR));
        if (Math.abs(v - t) < 1e-4) v = t;
        ref.setLowpass(Math.pow(2, v), TONE_Q, SR);
        ref.process(want, off, TONE_SUB_BLOCK);
      }
      tone.process(x, [new Float32Array(N), new Float32Array(N)], N);
      expect(x[0]).toEqual(want[0]);
      expect(x[1]).toEqual(want[1]);
    }
  });

  const kernel = WasmKernel.shared();

  it.runIf(kernel !== null)('filters a stereo block in module memory to the same bits as the TypeScript low-pass', () => {
    // Reference: the TypeScript cookbook filter (`BiquadLowpass.process`, checked against its transfer function in
    // test/dsp/small-dsp.test.ts) on a copy of the same input, with the same per-sub-block designs. The blocks cover
    // gliding and resting cutoffs, the crossfades of engaging and opening, a decay into the denormal flush (exact
    // zeros in the output), a non-finite input, and block sizes of one call (128 frames), two calls (200, the last
    // sub-block short) and a short block (45).
    const k = kernel!;
    const M = 256;
    const at = k.allocFloats(2 * M);
    const bits = (x: Float32Array) => Array.from(new Uint32Array(x.buffer, x.byteOffset, x.length));
    const inWasm = new VoiceTone(SR, 0.01);
    const inTs = new VoiceTone(SR, 0.01);
    const dry = [new Float32Array(M), new Float32Array(M)];
    const cutoffs = [OPEN_CUTOFF_HZ, 800, 800, 3000, 3000, OPEN_CUTOFF_HZ, OPEN_CUTOFF_HZ, 400, ...Array(40).fill(400), 2500];
    const sizes = [128, 200, 45];
    let flushed = 0;
    let t0 = 0;
    for (let b = 0; b < cutoffs.length; b++) {
      const n = sizes[b % sizes.length];
      const x = [new Float32Array(k.f32.buffer, at, n), new Float32Array(k.f32.buffer, at + 4 * M, n)];
      const quiet = b >= 9 && b < 47; // silence in: the output decays through 1e-25 and is flushed to zero
      for (let i = 0; i < n; i++) {
        x[0][i] = quiet ? 0 : 0.7 * Math.sin((2 * Math.PI * 300 * (t0 + i)) / SR);
        x[1][i] = quiet ? 0 : 0.5 * Math.sin((2 * Math.PI * 6100 * (t0 + i)) / SR);
      }
      t0 += n;
      if (b === cutoffs.length - 1) x[1][5] = NaN;
      const want = [Float32Array.from(x[0]), Float32Array.from(x[1])];
      for (const t of [inWasm, inTs]) t.aim({ cutoffHz: cutoffs[b] });
      if (b === 0) for (const t of [inWasm, inTs]) t.jump();
      inWasm.process(x, dry, n, k);
      inTs.process(want, dry, n);
      expect(inWasm.wet).toBe(inTs.wet);
      expect(bits(x[0])).toEqual(bits(want[0]));
      expect(bits(x[1])).toEqual(bits(want[1]));
      if (quiet && inTs.wet) for (let i = 1; i < n; i++) if (want[0][i] === 0 && want[0][i - 1] !== 0) flushed++;
    }
    expect(flushed).toBeGreaterThan(0);
    k.release(at, 8 * M);
  });
});
