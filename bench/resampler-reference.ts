// Reference resamplers measured beside ours: libsamplerate-js (wasm port of libsamplerate) and plain linear interpolation.
import * as lsrModule from '@alexanderolsen/libsamplerate-js';

/** libsamplerate converter numbers (its ConverterType): sinc medium = 1, sinc fastest = 2. */
export const SINC_MEDIUM = 1;
export const SINC_FASTEST = 2;

interface LsrConverter {
  simple(data: Float32Array): Float32Array;
  full(data: Float32Array, out?: Float32Array | null, len?: { frames: number } | null): Float32Array;
  destroy(): void;
}
type CreateFn = (ch: number, inRate: number, outRate: number, o: { converterType: number }) => Promise<LsrConverter>;

function createFn(): CreateFn {
  // The package is CommonJS; under Node's ESM loader its exports sit on `default`.
  const m = lsrModule as unknown as { create?: CreateFn; default?: { create: CreateFn } };
  return (m.default?.create ?? m.create) as CreateFn;
}

/** A libsamplerate converter for playback ratio `ratio` at 48 kHz output (input rate 48000·ratio, an integer for the ratios we use). */
export function libsamplerate(converterType: number, ratio: number): Promise<LsrConverter> {
  return createFn()(1, Math.round(48000 * ratio), 48000, { converterType });
}

/** Offline resample with libsamplerate's simple API (a fresh converter per call). */
export async function libsamplerateResample(input: Float32Array, ratio: number, converterType: number): Promise<Float32Array> {
  const src = await libsamplerate(converterType, ratio);
  try {
    return src.simple(input);
  } finally {
    src.destroy();
  }
}

/** Plain linear interpolation at a constant playback ratio (what a browser's rate control does). */
export function linearResample(input: Float32Array, ratio: number): Float32Array {
  const out = new Float32Array(Math.floor(input.length / ratio));
  linearInto(input, ratio, 0, out);
  return out;
}

/** Linear interpolation of `input` from position `start` at `ratio` into `out`; returns the next position. */
export function linearInto(input: Float32Array, ratio: number, start: number, out: Float32Array): number {
  let pos = start;
  const last = input.length - 1;
  for (let i = 0; i < out.length; i++) {
    const n = pos | 0;
    const f = pos - n;
    const a = n <= last ? input[n] : 0;
    const b = n + 1 <= last ? input[n + 1] : 0;
    out[i] = a + f * (b - a);
    pos += ratio;
    if (pos >= last) pos -= last;
  }
  return pos;
}
