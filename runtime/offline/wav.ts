// Whole WAV files in memory: decode a file's bytes, encode channels (header and samples from wav-format and
// wav-samples, which the command-line tool also uses to stream files block by block).
import { parseWavLayout, wavHeader, bytesPerSampleOf, WavError, type WavEncoding } from './wav-format';
import { decodeFrames, encodeFrames, TpdfDither, type SampleCounts } from './wav-samples';

export { WavError, type WavEncoding } from './wav-format';

/** Decoded audio: one Float32Array per channel, samples nominally in [−1, 1]. */
export interface WavAudio {
  /** Sample rate in Hz. */
  sampleRate: number;
  /** Channel data, all the same length (frames). */
  channels: Float32Array[];
  /** Encoding found in the file (reading) or to use (writing). */
  encoding: WavEncoding | 'pcm32';
  /** Reading: samples clamped to ±WAV_SAMPLE_BOUND or replaced (non-finite), 0 when absent. */
  clamped?: number;
}

/** Decodes a WAV file's bytes; throws WavError naming what is wrong (rates outside 8…384 kHz included). */
export function readWav(bytes: Uint8Array): WavAudio {
  const layout = parseWavLayout((o, n) => bytes.subarray(o, Math.min(bytes.length, o + n)), bytes.length);
  const out: Float32Array[] = [];
  for (let c = 0; c < layout.channels; c++) out.push(new Float32Array(layout.frames));
  const counts: SampleCounts = { clamped: 0, peak: 0 };
  const span = layout.frames * layout.channels * layout.bytesPerSample;
  decodeFrames(bytes.subarray(layout.dataStart, layout.dataStart + span), layout, layout.frames, out, 0, counts);
  return { sampleRate: layout.sampleRate, channels: out, encoding: layout.encoding, clamped: counts.clamped };
}

/**
 * Encodes channels as a WAV file (default 32-bit float); integer encodings clip to full scale and round, 16-bit
 * with TPDF dither (seeded: the same input gives the same bytes). Throws WavError for rates outside 8…384 kHz.
 */
export function writeWav(audio: { sampleRate: number; channels: readonly Float32Array[]; encoding?: WavEncoding }): Uint8Array {
  const encoding = audio.encoding ?? 'float32';
  const channels = audio.channels.length;
  if (channels < 1 || channels > 65535) throw new WavError(`cannot write ${channels} channels`);
  const frames = audio.channels[0].length;
  for (const ch of audio.channels) if (ch.length !== frames) throw new WavError('cannot write channels of different lengths');
  const header = wavHeader(audio.sampleRate, channels, encoding, frames);
  const dataBytes = frames * channels * bytesPerSampleOf(encoding);
  const bytes = new Uint8Array(44 + dataBytes + (dataBytes & 1));
  bytes.set(header, 0);
  encodeFrames(audio.channels, 0, frames, encoding, 1, bytes.subarray(44, 44 + dataBytes), { clamped: 0, peak: 0 }, encoding === 'pcm16' ? new TpdfDither() : null);
  return bytes;
}
