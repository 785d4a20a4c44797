// The per-sample ratios of propagating voices live in module memory on the WebAssembly kernel (KernelResidency): the
// read path reads them in place, never copying them into the module's ratio scratch, and an engine keeps rendering the
// same samples when another engine grows module memory (detaching the ratio view) mid-render. That the samples are the
// ones rendered before the ratios moved is render-hashes.test.ts's guard (its scenes have propagating voices).
import { describe, expect, it } from 'vitest';
import { WasmKernel } from '../../src/dsp';
import type { KernelPreference } from '../../src/index';
import { RUN_FRAMES } from '../../src/dsp/wasm/wasm-kernel';
import { engineAt, sine } from './engine-helpers';
import { line, renderScene, tone } from './propagation-helpers';

const SOUND_RATE = 12000;

/** A 40 m/s fly-by 5 m in front of the listener (Doppler read per sample); `each` runs before every block. */
function flyBy(kernel: KernelPreference, each?: (time: number) => void): { left: Float32Array; right: Float32Array; clamps: number } {
  const { left, right, engine } = renderScene({
    source: line([-16, 0, -5], [40, 0, 0]),
    listener: line([0, 0, 0], [0, 0, 0]),
    seconds: 0.6,
    exactVelocities: false,
    sound: tone(330, SOUND_RATE, 1),
    soundRate: SOUND_RATE,
    engine: { kernel },
    each: (_, t) => each?.(t),
  });
  const clamps = engine.stats.ratioClamps;
  engine.dispose();
  return { left, right, clamps };
}

/** Expects `a` and `b` to hold the same samples (a count of differing ones, then the first difference). */
function expectSame(a: Float32Array, b: Float32Array): void {
  let differ = 0;
  let first = -1;
  for (let i = 0; i < a.length; i++) {
    if (a[i] === b[i]) continue;
    if (first < 0) first = i;
    differ++;
  }
  expect({ differ, first }).toEqual({ differ: 0, first: -1 });
  expect(a.length).toBe(b.length);
}

describe('per-sample ratios in module memory', () => {
  const kernel = WasmKernel.shared();

  it.runIf(kernel !== null)("leaves the module's ratio scratch untouched: the ratios are read in place", () => {
    const k = kernel!;
    // Every copy of ratios not in module memory (whole block or run by run) goes to rawRatios; a NaN sentinel there
    // before each block must still be there after it. The ratios themselves are finite (no clamp counted).
    let touched = 0;
    let sentinel = -1;
    const check = () => {
      if (sentinel >= 0 && !Number.isNaN(k.f32[sentinel])) touched++;
      sentinel = k.rawRatios >> 2;
      k.f32.fill(NaN, sentinel, sentinel + RUN_FRAMES);
    };
    const { left, clamps } = flyBy('wasm-simd', check);
    check();
    expect(clamps).toBe(0);
    expect(left.some((x) => x !== 0)).toBe(true);
    expect(touched).toBe(0);
  });

  it.runIf(kernel !== null)('renders the same samples while another engine grows module memory', () => {
    const reference = flyBy('wasm-simd');
    let grown = 0;
    const others: { dispose(): void }[] = [];
    const disturbed = flyBy('wasm-simd', (t) => {
      // Twice mid-flight: a long sound on another engine grows module memory (its buffer detaches) between two blocks.
      if (grown >= 2 || t < 0.2 * (grown + 1)) return;
      const before = kernel!.exports.memory.buffer;
      const other = engineAt();
      other.addSound([sine(200, 48000, 30)], 48000);
      expect(kernel!.exports.memory.buffer).not.toBe(before);
      others.push(other);
      grown++;
    });
    for (const o of others) o.dispose();
    expect(grown).toBe(2);
    expectSame(disturbed.left, reference.left);
    expectSame(disturbed.right, reference.right);
  });
});
