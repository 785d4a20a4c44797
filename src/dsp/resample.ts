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
  /** Sample rate of the input and the output, Hz (8000…768000, default 48000): picks the kernel design for that rate (`tierDesignAt`). */
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
  const out = new Float32Array(outputLength(input, ratio));
  let at = 0;
  for (const chunk of resampleChunks(input, ratio, options)) {
    out.set(chunk, at);
    at += chunk.length;
  }
  return out;
}

/**
 * The same output as `resample`, in chunks of up to `chunkFrames` (1…65536, default 4096) written into one reused
 * buffer: each yielded array is valid until the next step (copy it or write it out). Memory stays bounded by the
 * chunk, and no output array is allocated: the streaming path's speed, for writing to disk. Throws DspArgumentError.
 */
export function* resampleChunks(input: Float32Array, ratio: number | Float32Array, options?: ResampleOptions, chunkFrames = BLOCK): Generator<Float32Array, void, void> {
  const q = options?.quality ?? defaultQualityTier;
  if (!isQualityTier(q)) throw new DspArgumentError('quality', `unknown quality tier ${JSON.stringify(q)} (expected draft, standard or high)`);
  const kernel = options?.kernel ?? 'auto';
  if (kernel !== 'auto' && kernel !== 'typescript' && kernel !== 'wasm-simd') throw new DspArgumentError('kernel', `unknown kernel ${JSON.stringify(kernel)} (expected auto, typescript or wasm-simd)`);
  const sampleRate = options?.sampleRate ?? 48000;
  if (!(sampleRate >= 8000 && sampleRate <= 768000)) throw new DspArgumentError('sampleRate', `must be 8000…768000 Hz, got ${sampleRate}`);
  if (!(Number.isInteger(chunkFrames) && chunkFrames >= 1 && chunkFrames <= 65536)) throw new DspArgumentError('chunkFrames', `must be an integer in 1…65536, got ${chunkFrames}`);
  const n = outputLength(input, ratio);
  const reader = new StreamReader({ table: KernelTable.forTier(q, sampleRate), channels: 1, kernel });
  // The streaming path as the engine runs it: the source resident in the kernel's memory (no per-run span copies).
  const wasm = reader.kernelName === 'wasm-simd' && input.length <= RESIDENT_LIMIT ? WasmKernel.shared() : null;
  const resident = wasm !== null && wasm.upload(input);
  try {
    reader.setSource([input]);
    const buffer = [new Float32Array(Math.min(chunkFrames, Math.max(1, n)))];
    for (let o = 0; o < n; o += chunkFrames) {
      const m = Math.min(chunkFrames, n - o);
      if (typeof ratio === 'number') reader.read(buffer, 0, m, ratio, ratio);
      else reader.readRatios(buffer, 0, m, ratio, o);
      yield m === buffer[0].length ? buffer[0] : buffer[0].subarray(0, m);
    }
  } finally {
    if (resident) wasm.discard(input);
  }
}

/** Output length for `ratio` (validated here: DspArgumentError). */
function outputLength(input: Float32Array, ratio: number | Float32Array): number {
  if (typeof ratio === 'number') {
    checkRatio(ratio, 'ratio');
    return Math.floor(input.length / ratio);
  }
  if (!(ratio instanceof Float32Array)) throw new DspArgumentError('ratio', 'must be a number or a Float32Array');
  for (let i = 0; i < ratio.length; i++) checkRatio(ratio[i], `ratio[${i}]`);
  return ratio.length;
}
