// RIFF WAVE reading and writing: PCM 16/24/32-bit integer and 32-bit IEEE float, plain or
// WAVE_FORMAT_EXTENSIBLE headers (Microsoft/IBM "Multimedia Programming Interface and Data
// Specifications 1.0", 1991, and the WAVEFORMATEXTENSIBLE documentation; layout from memory).

/** Sample encodings this module writes; reading also accepts 32-bit integer PCM. */
export type WavEncoding = 'pcm16' | 'pcm24' | 'float32';

/** Decoded audio: one Float32Array per channel, samples nominally in [−1, 1]. */
export interface WavAudio {
  /** Sample rate in Hz. */
  sampleRate: number;
  /** Channel data, all the same length (frames). */
  channels: Float32Array[];
  /** Encoding found in the file (reading) or to use (writing). */
  encoding: WavEncoding | 'pcm32';
}

/** A file that is not a WAV file, is truncated, or uses an encoding this module does not read. */
export class WavError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'WavError';
  }
}

const FORMAT_PCM = 1;
const FORMAT_FLOAT = 3;
const FORMAT_EXTENSIBLE = 0xfffe;

function tag(view: DataView, offset: number): string {
  return String.fromCharCode(view.getUint8(offset), view.getUint8(offset + 1), view.getUint8(offset + 2), view.getUint8(offset + 3));
}

/** Decodes a WAV file's bytes; throws WavError naming what is wrong. */
export function readWav(bytes: Uint8Array): WavAudio {
  if (bytes.length < 12) throw new WavError(`not a WAV file: only ${bytes.length} bytes (a RIFF header needs 12)`);
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (tag(view, 0) !== 'RIFF' || tag(view, 8) !== 'WAVE') throw new WavError('not a WAV file: missing the RIFF/WAVE header');
  let offset = 12;
  let fmt: { format: number; channels: number; sampleRate: number; blockAlign: number; bits: number } | null = null;
  let dataStart = -1;
  let dataBytes = 0;
  while (offset + 8 <= bytes.length) {
    const id = tag(view, offset);
    const size = view.getUint32(offset + 4, true);
    const body = offset + 8;
    if (id === 'fmt ') {
      if (size < 16 || body + 16 > bytes.length) throw new WavError('truncated WAV file: the fmt chunk is incomplete');
      let format = view.getUint16(body, true);
      const channels = view.getUint16(body + 2, true);
      const sampleRate = view.getUint32(body + 4, true);
      const blockAlign = view.getUint16(body + 12, true);
      const bits = view.getUint16(body + 14, true);
      if (format === FORMAT_EXTENSIBLE) {
        if (size < 40 || body + 26 > bytes.length) throw new WavError('truncated WAV file: the extensible fmt chunk is incomplete');
        format = view.getUint16(body + 24, true); // first two bytes of the sub-format GUID
      }
      fmt = { format, channels, sampleRate, blockAlign, bits };
    } else if (id === 'data') {
      dataStart = body;
      dataBytes = Math.min(size, bytes.length - body);
      if (size > bytes.length - body) throw new WavError(`truncated WAV file: the data chunk declares ${size} bytes but ${bytes.length - body} are present`);
      break;
    }
    offset = body + size + (size & 1);
  }
  if (!fmt) throw new WavError('malformed WAV file: no fmt chunk before the data');
  if (dataStart < 0) throw new WavError('malformed WAV file: no data chunk');
  const { format, channels, sampleRate, bits } = fmt;
  if (channels < 1) throw new WavError('malformed WAV file: zero channels');
  if (sampleRate < 1) throw new WavError('malformed WAV file: zero sample rate');
  let encoding: WavAudio['encoding'];
  if (format === FORMAT_PCM && bits === 16) encoding = 'pcm16';
  else if (format === FORMAT_PCM && bits === 24) encoding = 'pcm24';
  else if (format === FORMAT_PCM && bits === 32) encoding = 'pcm32';
  else if (format === FORMAT_FLOAT && bits === 32) encoding = 'float32';
  else {
    const kind = format === FORMAT_PCM ? 'integer PCM' : format === FORMAT_FLOAT ? 'float' : `format tag ${format}`;
    throw new WavError(`unsupported WAV encoding: ${bits}-bit ${kind} (supported: 16/24/32-bit integer PCM, 32-bit float)`);
  }
  const bytesPerSample = bits / 8;
  const frameBytes = bytesPerSample * channels;
  const frames = Math.floor(dataBytes / frameBytes);
  const out: Float32Array[] = [];
  for (let c = 0; c < channels; c++) out.push(new Float32Array(frames));
  for (let i = 0; i < frames; i++) {
    const base = dataStart + i * frameBytes;
    for (let c = 0; c < channels; c++) {
      const p = base + c * bytesPerSample;
      let v: number;
      if (encoding === 'pcm16') v = view.getInt16(p, true) / 32768;
      else if (encoding === 'pcm24') {
        const u = view.getUint8(p) | (view.getUint8(p + 1) << 8) | (view.getUint8(p + 2) << 16);
        v = ((u << 8) >> 8) / 8388608;
      } else if (encoding === 'pcm32') v = view.getInt32(p, true) / 2147483648;
      else v = view.getFloat32(p, true);
      out[c][i] = v;
    }
  }
  return { sampleRate, channels: out, encoding };
}

/** Encodes channels as a WAV file (default 32-bit float); integer encodings clamp to [−1, 1) and round. */
export function writeWav(audio: { sampleRate: number; channels: readonly Float32Array[]; encoding?: WavEncoding }): Uint8Array {
  const encoding = audio.encoding ?? 'float32';
  const channels = audio.channels.length;
  if (channels < 1 || channels > 65535) throw new WavError(`cannot write ${channels} channels`);
  const frames = audio.channels[0].length;
  for (const ch of audio.channels) if (ch.length !== frames) throw new WavError('cannot write channels of different lengths');
  const sampleRate = Math.round(audio.sampleRate);
  if (!(sampleRate >= 1 && sampleRate <= 0xffffffff)) throw new WavError(`cannot write sample rate ${audio.sampleRate}`);
  const bytesPerSample = encoding === 'pcm16' ? 2 : encoding === 'pcm24' ? 3 : 4;
  const blockAlign = bytesPerSample * channels;
  const dataBytes = frames * blockAlign;
  if (dataBytes > 0xffffffff - 44) throw new WavError('audio too long for a WAV file (over 4 GiB)');
  const bytes = new Uint8Array(44 + dataBytes + (dataBytes & 1));
  const view = new DataView(bytes.buffer);
  const put = (offset: number, s: string) => {
    for (let i = 0; i < 4; i++) view.setUint8(offset + i, s.charCodeAt(i));
  };
  put(0, 'RIFF');
  view.setUint32(4, bytes.length - 8, true);
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
  let p = 44;
  for (let i = 0; i < frames; i++) {
    for (let c = 0; c < channels; c++) {
      const x = audio.channels[c][i];
      const v = x === x ? x : 0; // NaN becomes silence
      if (encoding === 'float32') view.setFloat32(p, v, true);
      else if (encoding === 'pcm16') view.setInt16(p, Math.max(-32768, Math.min(32767, Math.round(v * 32768))), true);
      else {
        const q = Math.max(-8388608, Math.min(8388607, Math.round(v * 8388608)));
        view.setUint8(p, q & 0xff);
        view.setUint8(p + 1, (q >> 8) & 0xff);
        view.setUint8(p + 2, (q >> 16) & 0xff);
      }
      p += bytesPerSample;
    }
  }
  return bytes;
}
