// Offline variable-speed replay of a mono buffer at the same sample rate, by the StreamReader's bandlimited interpolation.
import { DspArgumentError } from './dsp-argument-error';
import { KernelTable } from './kernel-table';
import { MAX_RATIO, MIN_RATIO, defaultQualityTier, isQualityTier } from './quality-tiers';
import { StreamReader } from './stream-reader';
import type { KernelPreference } from './wasm/wasm-kernel';

/** Options of `resample`. */
export interface ResampleOptions {
  /** Quality tier name ('draft' | 'standard' | 'high'); default 'standard'. */
  quality?: string;
  /** Inner loop: 'auto' (default: WebAssembly SIMD where available), 'typescript' (the reference) or 'wasm-simd' (throws where unavailable). */
  kernel?: KernelPreference;
}

function checkRatio(r: number, argument: string): void {
  if (!Number.isFinite(r) || r <= 0 || r > MAX_RATIO) {
    throw new DspArgumentError(argument, `playback ratio must be finite and in (0, ${MAX_RATIO}], got ${r}`);
  }
  if (r < MIN_RATIO) throw new DspArgumentError(argument, `playback ratio below the supported minimum ${MIN_RATIO}, got ${r}`);
}

/**
 * Replays `input` at playback ratio `ratio` (source frames per output frame, (0, 4]): a number gives
 * floor(input.length / ratio) output samples; a Float32Array gives one ratio per output sample. Throws DspArgumentError.
 */
export function resample(input: Float32Array, ratio: number | Float32Array, options?: ResampleOptions): Float32Array {
  const q = options?.quality ?? defaultQualityTier;
  if (!isQualityTier(q)) throw new DspArgumentError('quality', `unknown quality tier ${JSON.stringify(q)} (expected draft, standard or high)`);
  const kernel = options?.kernel ?? 'auto';
  if (kernel !== 'auto' && kernel !== 'typescript' && kernel !== 'wasm-simd') throw new DspArgumentError('kernel', `unknown kernel ${JSON.stringify(kernel)} (expected auto, typescript or wasm-simd)`);
  const reader = new StreamReader({ table: KernelTable.forTier(q), channels: 1, kernel });
  reader.setSource([input]);
  if (typeof ratio === 'number') {
    checkRatio(ratio, 'ratio');
    const out = new Float32Array(Math.floor(input.length / ratio));
    const outs = [out];
    const block = 4096;
    for (let o = 0; o < out.length; o += block) reader.read(outs, o, Math.min(block, out.length - o), ratio, ratio);
    return out;
  }
  if (!(ratio instanceof Float32Array)) throw new DspArgumentError('ratio', 'must be a number or a Float32Array');
  for (let i = 0; i < ratio.length; i++) checkRatio(ratio[i], `ratio[${i}]`);
  const out = new Float32Array(ratio.length);
  reader.readRatios([out], 0, out.length, ratio, 0);
  return out;
}
