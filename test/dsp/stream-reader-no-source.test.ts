// A reader used before any source is set has no channels to write: it must return (never hang or throw),
// leave the caller's buffers alone and advance its position by the ratios, on every kernel and tier.
import { describe, expect, it } from 'vitest';
import { KernelTable, StreamReader, activeKernel, qualityTiers } from '../../src/dsp';

const kernels = activeKernel() === 'wasm-simd' ? (['typescript', 'wasm-simd'] as const) : (['typescript'] as const);

describe('StreamReader without a source', () => {
  for (const kernel of kernels) {
    for (const tier of qualityTiers) {
      it(`returns with buffers untouched and the position advanced (${kernel} kernel, ${tier} tier)`, () => {
        const reader = new StreamReader({ table: KernelTable.forTier(tier), channels: 2, kernel });
        const left = new Float32Array(128).fill(0.25);
        const right = new Float32Array(128).fill(0.25);
        reader.read([left, right], 0, 128, 1.5, 1.5);
        expect(reader.position).toBeCloseTo(128 * 1.5, 9);
        reader.readRatios([left, right], 0, 128, new Float32Array(128).fill(0.5), 0);
        expect(reader.position).toBeCloseTo(128 * 1.5 + 128 * 0.5, 9);
        expect(left.every((v) => v === 0.25)).toBe(true);
        expect(right.every((v) => v === 0.25)).toBe(true);
      });
    }
  }
});
