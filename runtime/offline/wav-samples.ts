// WAV sample coding: little-endian PCM and IEEE float frames to and from Float32Array channels, with input samples
// bounded (clamped and counted) and 16-bit output dithered by TPDF (triangular probability density, two uniform
// variates summed: Lipshitz, Wannamaker & Vanderkooy, "Quantization and Dither: A Theoretical Survey", JAES 40(5),
// 1992); noise from xorshift32 (Marsaglia, J. Stat. Softw. 8(14), 2003).
import type { WavEncoding, WavLayout } from './wav-format';

/** Largest |sample| kept when reading (+24 dBFS); larger values are clamped, non-finite ones become 0 (both counted). */
export const WAV_SAMPLE_BOUND = 16;

/** Counters of a decode or encode: input samples clamped, output samples clipped and the peak seen (linear). */
export interface SampleCounts {
  /** Reading: samples beyond ±WAV_SAMPLE_BOUND or non-finite. Writing: samples beyond full scale (±1, 0 dBFS), which integer encodings clip. */
  clamped: number;
  /** Largest |sample| seen before clamping (non-finite counts as Infinity). */
  peak: number;
}

/** Decodes `frames` frames from `bytes` (interleaved, starting at byte 0) into out[c][at…]; counts into `counts`. */
export function decodeFrames(bytes: Uint8Array, layout: Pick<WavLayout, 'channels' | 'encoding' | 'bytesPerSample'>, frames: number, out: readonly Float32Array[], at: number, counts: SampleCounts): void {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const { channels, encoding, bytesPerSample } = layout;
  const keep = Math.min(channels, out.length);
  let peak = counts.peak;
  for (let i = 0; i < frames; i++) {
    const base = i * channels * bytesPerSample;
    for (let c = 0; c < keep; c++) {
      const p = base + c * bytesPerSample;
      let v: number;
      if (encoding === 'pcm16') v = view.getInt16(p, true) / 32768;
      else if (encoding === 'pcm24') v = ((bytes[p] | (bytes[p + 1] << 8) | (bytes[p + 2] << 16)) << 8 >> 8) / 8388608;
      else if (encoding === 'pcm32') v = view.getInt32(p, true) / 2147483648;
      else {
        v = view.getFloat32(p, true);
        const a = v < 0 ? -v : v;
        if (!(a <= WAV_SAMPLE_BOUND)) {
          counts.clamped++;
          peak = Math.max(peak, v === v ? a : Infinity);
          v = v !== v ? 0 : v > 0 ? WAV_SAMPLE_BOUND : -WAV_SAMPLE_BOUND;
        }
      }
      const a = v < 0 ? -v : v;
      if (a > peak) peak = a;
      out[c][at + i] = v;
    }
  }
  counts.peak = peak;
}

/** TPDF dither state for 16-bit output: seeded, so the same input gives the same file. */
export class TpdfDither {
  private s: number;
  /** Seeds the noise (any integer; 0 takes a fixed non-zero seed). */
  constructor(seed = 0x2545f491) {
    this.s = seed >>> 0 || 0x9e3779b9;
  }

  /** Triangular noise in (−1, 1) LSB: the sum of two independent uniform variates in [−0.5, 0.5). */
  next(): number {
    let s = this.s;
    s ^= s << 13;
    s >>>= 0;
    s ^= s >>> 17;
    s ^= s << 5;
    s >>>= 0;
    const u1 = s / 4294967296;
    s ^= s << 13;
    s >>>= 0;
    s ^= s >>> 17;
    s ^= s << 5;
    s >>>= 0;
    this.s = s;
    return u1 + s / 4294967296 - 1;
  }
}

/**
 * Encodes frames [from, from + frames) of `channels`, multiplied by `gain`, into `out` (interleaved, from byte 0).
 * Samples beyond ±1 are counted in `counts.clamped` (integer encodings clip them); pcm16 adds `dither` before rounding.
 * NaN becomes silence. `counts.peak` is the largest |sample| after gain, before clipping.
 */
export function encodeFrames(channels: readonly Float32Array[], from: number, frames: number, encoding: WavEncoding, gain: number, out: Uint8Array, counts: SampleCounts, dither: TpdfDither | null): void {
  const view = new DataView(out.buffer, out.byteOffset, out.byteLength);
  const n = channels.length;
  let p = 0;
  let peak = counts.peak;
  for (let i = from; i < from + frames; i++) {
    for (let c = 0; c < n; c++) {
      const x = channels[c][i] * gain;
      const v = x === x ? x : 0;
      const a = v < 0 ? -v : v;
      if (a > peak) peak = a;
      if (a > 1) counts.clamped++;
      if (encoding === 'float32') {
        view.setFloat32(p, v, true);
        p += 4;
        continue;
      }
      if (encoding === 'pcm16') {
        const q = Math.round(v * 32768 + (dither === null ? 0 : dither.next()));
        view.setInt16(p, q > 32767 ? 32767 : q < -32768 ? -32768 : q, true);
        p += 2;
      } else {
        let q = Math.round(v * 8388608);
        q = q > 8388607 ? 8388607 : q < -8388608 ? -8388608 : q;
        out[p] = q & 0xff;
        out[p + 1] = (q >> 8) & 0xff;
        out[p + 2] = (q >> 16) & 0xff;
        p += 3;
      }
    }
  }
  counts.peak = peak;
}
