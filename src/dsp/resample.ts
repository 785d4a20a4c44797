// Offline variable-speed replay of a mono buffer at the same sample rate, by the StreamReader's bandlimited interpolation
// (J. O. Smith, "Digital Audio Resampling", CCRMA), driven exactly as the engine streams it.
import { DspArgumentError } from './dsp-argument-error';
import { KernelTable } from './kernel-table';
import { MAX_RATIO, MIN_RATIO, defaultQualityTier, isQualityTier } from './quality-tiers';
import { StreamReader } from './stream-reader';
import { WasmKernel, type KernelPreference } from './wasm/wasm-kernel';

/** Options of `resample`. */
export interface ResampleOptions {
  /** Quality tier name ('draft' | 'standard' | 'high'); default 'standard'. */
  quality?: string;
  /** Inner loop: 'auto' (default: WebAssembly SIMD where available), 'typescript' (the reference) or 'wasm-simd' (throws where unavailable). */
  kernel?: KernelPreference;
  /** Sample rate of the input and the output, Hz (8000…192000, default 48000): picks the kernel design for that rate (`tierDesignAt`). */
  sampleRate?: number;
}

/** Inputs up to this many frames are copied once into the WebAssembly kernel's memory and read there in place. */
const RESIDENT_LIMIT = 1 << 24;
/** Output frames per streaming read. */
const BLOCK = 4096;

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
  const sampleRate = options?.sampleRate ?? 48000;
  if (!(sampleRate >= 8000 && sampleRate <= 192000)) throw new DspArgumentError('sampleRate', `must be 8000…192000 Hz, got ${sampleRate}`);
  if (typeof ratio === 'number') checkRatio(ratio, 'ratio');
  else if (!(ratio instanceof Float32Array)) throw new DspArgumentError('ratio', 'must be a number or a Float32Array');
  else for (let i = 0; i < ratio.length; i++) checkRatio(ratio[i], `ratio[${i}]`);
  const reader = new StreamReader({ table: KernelTable.forTier(q, sampleRate), channels: 1, kernel });
  // The streaming path as the engine runs it: the source resident in the kernel's memory (no per-run span copies).
  const wasm = reader.kernelName === 'wasm-simd' && input.length <= RESIDENT_LIMIT ? WasmKernel.shared() : null;
  const resident = wasm !== null && wasm.upload(input);
  try {
    reader.setSource([input]);
    const outs = [new Float32Array(typeof ratio === 'number' ? Math.floor(input.length / ratio) : ratio.length)];
    const n = outs[0].length;
    for (let o = 0; o < n; o += BLOCK) {
      const m = Math.min(BLOCK, n - o);
      if (typeof ratio === 'number') reader.read(outs, o, m, ratio, ratio);
      else reader.readRatios(outs, o, m, ratio, o);
    }
    return outs[0];
  } finally {
    if (resident) wasm.discard(input);
  }
}
