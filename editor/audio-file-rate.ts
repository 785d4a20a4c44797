// Reads the sample rate an audio file was made at from its header, so that it can be decoded without resampling.
// Layouts: RIFF/WAVE "fmt " chunk (Microsoft/IBM RIFF WAVE); FLAC STREAMINFO (FLAC format specification);
// Ogg page + Vorbis identification header (Vorbis I specification §4.2.2) and Opus (RFC 7845 §5.1: decoded at
// 48 kHz); MPEG-1/2/2.5 audio frame header (ISO/IEC 11172-3, 13818-3) after an ID3v2 tag. See docs/references.md §17.

/** What the header says: the rate in Hz and the container it was read from; null rate = not recognised. */
export interface AudioFileRate {
  readonly sampleRate: number | null;
  readonly format: 'wav' | 'flac' | 'ogg-vorbis' | 'ogg-opus' | 'mp3' | 'unknown';
}

const ascii = (b: Uint8Array, at: number, n: number): string => String.fromCharCode(...b.subarray(at, at + n));

function wavRate(b: Uint8Array, v: DataView): number | null {
  for (let at = 12; at + 8 <= b.length; ) {
    const id = ascii(b, at, 4);
    const size = v.getUint32(at + 4, true);
    if (id === 'fmt ' && at + 16 <= b.length) return v.getUint32(at + 12, true);
    at += 8 + size + (size & 1);
  }
  return null;
}

function flacRate(b: Uint8Array): number | null {
  // First metadata block must be STREAMINFO (type 0); the rate is the 20 bits after 10 bytes of block data.
  if (b.length < 4 + 4 + 13 || (b[4] & 0x7f) !== 0) return null;
  const d = 8 + 10;
  return (b[d] << 12) | (b[d + 1] << 4) | (b[d + 2] >> 4);
}

function oggRate(b: Uint8Array, v: DataView): AudioFileRate {
  const segments = b[26];
  const body = 27 + segments;
  if (body + 16 > b.length) return { sampleRate: null, format: 'unknown' };
  if (b[body] === 1 && ascii(b, body + 1, 6) === 'vorbis') return { sampleRate: v.getUint32(body + 12, true), format: 'ogg-vorbis' };
  if (ascii(b, body, 8) === 'OpusHead') return { sampleRate: 48000, format: 'ogg-opus' };
  return { sampleRate: null, format: 'unknown' };
}

/** Sample rates of MPEG audio by version bits (00 = 2.5, 10 = 2, 11 = 1) and rate index 0…2. */
const MPEG_RATES: Record<number, readonly number[]> = { 0: [11025, 12000, 8000], 2: [22050, 24000, 16000], 3: [44100, 48000, 32000] };

function mp3Rate(b: Uint8Array): number | null {
  let at = 0;
  if (ascii(b, 0, 3) === 'ID3' && b.length >= 10) at = 10 + ((b[6] << 21) | (b[7] << 14) | (b[8] << 7) | b[9]);
  for (const end = Math.min(b.length - 3, at + 65536); at < end; at++) {
    if (b[at] !== 0xff || (b[at + 1] & 0xe0) !== 0xe0) continue;
    const version = (b[at + 1] >> 3) & 3;
    const layer = (b[at + 1] >> 1) & 3;
    const rateIndex = (b[at + 2] >> 2) & 3;
    if (version === 1 || layer === 0 || rateIndex === 3 || (b[at + 2] >> 4) === 15) continue;
    return MPEG_RATES[version][rateIndex];
  }
  return null;
}

/** Reads the sample rate from the first bytes of an audio file (64 KiB is plenty). */
export function readAudioFileRate(bytes: ArrayBuffer | Uint8Array): AudioFileRate {
  const b = bytes instanceof Uint8Array ? bytes : new Uint8Array(bytes);
  const v = new DataView(b.buffer, b.byteOffset, b.byteLength);
  if (b.length >= 12 && ascii(b, 0, 4) === 'RIFF' && ascii(b, 8, 4) === 'WAVE') return { sampleRate: wavRate(b, v), format: 'wav' };
  if (b.length >= 4 && ascii(b, 0, 4) === 'fLaC') return { sampleRate: flacRate(b), format: 'flac' };
  if (b.length >= 27 && ascii(b, 0, 4) === 'OggS') return oggRate(b, v);
  const mp3 = b.length >= 4 ? mp3Rate(b) : null;
  return mp3 !== null ? { sampleRate: mp3, format: 'mp3' } : { sampleRate: null, format: 'unknown' };
}
