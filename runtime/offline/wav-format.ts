// RIFF WAVE headers: the fmt and data chunks of PCM 16/24/32-bit integer and 32-bit IEEE float files, plain or
// WAVE_FORMAT_EXTENSIBLE (Microsoft/IBM "Multimedia Programming Interface and Data Specifications 1.0", 1991, and
// the WAVEFORMATEXTENSIBLE documentation; layout from memory). Parsed through a positional reader so that a file
// on disk is never read whole.

/** Sample encodings this module writes; reading also accepts 32-bit integer PCM. */
export type WavEncoding = 'pcm16' | 'pcm24' | 'float32';

/** A file that is not a WAV file, is truncated, or uses an encoding or rate this module does not take. */
export class WavError extends Error {
  /** A WavError with `message` saying what is wrong. */
  constructor(message: string) {
    super(message);
    this.name = 'WavError';
  }
}

/** Lowest and highest sample rate read or written, Hz (integers only; the WAV field itself is an integer). */
export const WAV_RATE_RANGE = Object.freeze({ min: 8000, max: 384000 });

/** What a WAV header says about its samples and where they are. */
export interface WavLayout {
  /** Sample rate, Hz (integer, 8000…384000). */
  sampleRate: number;
  /** Channel count (1…65535). */
  channels: number;
  /** Sample encoding. */
  encoding: WavEncoding | 'pcm32';
  /** Bytes per sample (2, 3 or 4). */
  bytesPerSample: number;
  /** Byte offset of the first sample in the file. */
  dataStart: number;
  /** Whole frames in the data chunk. */
  frames: number;
}

/** Chunks looked at before the data chunk; a file of millions of tiny chunks is refused instead of crawled. */
const MAX_CHUNKS = 4096;
const FORMAT_PCM = 1;
const FORMAT_FLOAT = 3;
const FORMAT_EXTENSIBLE = 0xfffe;

function tag(b: Uint8Array, at: number): string {
  return String.fromCharCode(b[at], b[at + 1], b[at + 2], b[at + 3]);
}

/** Throws WavError unless `rate` is an integer within WAV_RATE_RANGE; `what` starts the message. */
export function checkWavRate(rate: number, what: string): void {
  if (!Number.isInteger(rate) || rate < WAV_RATE_RANGE.min || rate > WAV_RATE_RANGE.max) {
    throw new WavError(`${what} ${rate} Hz is outside the supported ${WAV_RATE_RANGE.min}…${WAV_RATE_RANGE.max} Hz (whole hertz)`);
  }
}

/**
 * Reads a WAV header through `readAt(offset, length)` (which returns at most `length` bytes, fewer at the end) of a
 * file of `totalBytes`; throws WavError naming what is wrong. Chunks before the data are skipped, not read.
 */
export function parseWavLayout(readAt: (offset: number, length: number) => Uint8Array, totalBytes: number): WavLayout {
  if (totalBytes < 12) throw new WavError(`not a WAV file: only ${totalBytes} bytes (a RIFF header needs 12)`);
  const head = readAt(0, 12);
  if (tag(head, 0) !== 'RIFF' || tag(head, 8) !== 'WAVE') throw new WavError('not a WAV file: missing the RIFF/WAVE header');
  let offset = 12;
  let fmt: { format: number; channels: number; sampleRate: number; bits: number } | null = null;
  for (let chunks = 0; offset + 8 <= totalBytes; chunks++) {
    if (chunks >= MAX_CHUNKS) throw new WavError(`malformed WAV file: more than ${MAX_CHUNKS} chunks before the data`);
    const h = readAt(offset, 8);
    const v = new DataView(h.buffer, h.byteOffset, h.byteLength);
    const id = tag(h, 0);
    const size = v.getUint32(4, true);
    const body = offset + 8;
    if (id === 'fmt ') {
      if (size < 16 || body + 16 > totalBytes) throw new WavError('truncated WAV file: the fmt chunk is incomplete');
      const f = readAt(body, Math.min(size, 40));
      const fv = new DataView(f.buffer, f.byteOffset, f.byteLength);
      let format = fv.getUint16(0, true);
      if (format === FORMAT_EXTENSIBLE) {
        if (size < 40 || f.length < 26) throw new WavError('truncated WAV file: the extensible fmt chunk is incomplete');
        format = fv.getUint16(24, true); // first two bytes of the sub-format GUID
      }
      fmt = { format, channels: fv.getUint16(2, true), sampleRate: fv.getUint32(4, true), bits: fv.getUint16(14, true) };
    } else if (id === 'data') {
      if (size > totalBytes - body) throw new WavError(`truncated WAV file: the data chunk declares ${size} bytes but ${totalBytes - body} are present`);
      return layoutOf(fmt, body, size);
    }
    offset = body + size + (size & 1);
  }
  if (!fmt) throw new WavError('malformed WAV file: no fmt chunk before the data');
  throw new WavError('malformed WAV file: no data chunk');
}

function layoutOf(fmt: { format: number; channels: number; sampleRate: number; bits: number } | null, dataStart: number, dataBytes: number): WavLayout {
  if (!fmt) throw new WavError('malformed WAV file: no fmt chunk before the data');
  const { format, channels, sampleRate, bits } = fmt;
  if (channels < 1) throw new WavError('malformed WAV file: zero channels');
  if (sampleRate < 1) throw new WavError('malformed WAV file: zero sample rate');
  checkWavRate(sampleRate, 'sample rate');
  let encoding: WavLayout['encoding'];
  if (format === FORMAT_PCM && bits === 16) encoding = 'pcm16';
  else if (format === FORMAT_PCM && bits === 24) encoding = 'pcm24';
  else if (format === FORMAT_PCM && bits === 32) encoding = 'pcm32';
  else if (format === FORMAT_FLOAT && bits === 32) encoding = 'float32';
  else {
    const kind = format === FORMAT_PCM ? 'integer PCM' : format === FORMAT_FLOAT ? 'float' : `format tag ${format}`;
    throw new WavError(`unsupported WAV encoding: ${bits}-bit ${kind} (supported: 16/24/32-bit integer PCM, 32-bit float)`);
  }
  const bytesPerSample = bits / 8;
  return { sampleRate, channels, encoding, bytesPerSample, dataStart, frames: Math.floor(dataBytes / (bytesPerSample * channels)) };
}

/** Bytes per sample of an encoding written. */
export function bytesPerSampleOf(encoding: WavEncoding): number {
  return encoding === 'pcm16' ? 2 : encoding === 'pcm24' ? 3 : 4;
}

/** The 44-byte canonical header of a file of `frames` frames; throws WavError for a bad rate, channel count or size. */
export function wavHeader(sampleRate: number, channels: number, encoding: WavEncoding, frames: number): Uint8Array {
  if (!Number.isInteger(channels) || channels < 1 || channels > 65535) throw new WavError(`cannot write ${channels} channels`);
  checkWavRate(sampleRate, 'cannot write sample rate');
  const bytesPerSample = bytesPerSampleOf(encoding);
  const blockAlign = bytesPerSample * channels;
  const dataBytes = frames * blockAlign;
  if (dataBytes > 0xffffffff - 44) throw new WavError('audio too long for a WAV file (over 4 GiB)');
  const bytes = new Uint8Array(44);
  const view = new DataView(bytes.buffer);
  const put = (offset: number, s: string) => {
    for (let i = 0; i < 4; i++) view.setUint8(offset + i, s.charCodeAt(i));
  };
  put(0, 'RIFF');
  view.setUint32(4, 36 + dataBytes + (dataBytes & 1), true);
  put(8, 'WAVE');
  put(12, 'fmt ');
  view.setUint32(16, 16, true);
  view.setUint16(20, encoding === 'float32' ? FORMAT_FLOAT : FORMAT_PCM, true);
  view.setUint16(22, channels, true);
  view.setUint32(24, sampleRate, true);
  view.setUint32(28, sampleRate * blockAlign, true);
  view.setUint16(32, blockAlign, true);
  view.setUint16(34, bytesPerSample * 8, true);
  put(36, 'data');
  view.setUint32(40, dataBytes, true);
  return bytes;
}
