// Reads the sample rate a compressed or PCM audio file decodes at, from its header alone: RIFF/RF64 WAVE "fmt "
// chunk, FLAC STREAMINFO, Ogg Vorbis identification header, Ogg Opus (always 48 kHz), MPEG-1/2/2.5 audio frame
// header (after an ID3v2 tag). Layouts from the format specifications named in docs/references.md §15.

const MPEG_RATES: Readonly<Record<number, readonly number[]>> = Object.freeze({
  3: [44100, 48000, 32000], // MPEG-1
  2: [22050, 24000, 16000], // MPEG-2
  0: [11025, 12000, 8000], // MPEG-2.5
});

const ascii = (b: Uint8Array, at: number, text: string) => {
  if (at + text.length > b.length) return false;
  for (let i = 0; i < text.length; i++) if (b[at + i] !== text.charCodeAt(i)) return false;
  return true;
};
const u32le = (b: Uint8Array, at: number) => (b[at] | (b[at + 1] << 8) | (b[at + 2] << 16) | (b[at + 3] << 24)) >>> 0;

function wavRate(b: Uint8Array): number | null {
  let at = 12;
  while (at + 8 <= b.length) {
    const size = u32le(b, at + 4);
    if (ascii(b, at, 'fmt ')) return at + 16 <= b.length ? u32le(b, at + 12) : null;
    at += 8 + size + (size & 1);
  }
  return null;
}

function flacRate(b: Uint8Array, at: number): number | null {
  // "fLaC", a 4-byte metadata block header, then STREAMINFO: 2+2+3+3 bytes before the 20-bit sample rate.
  const p = at + 18;
  if (p + 3 > b.length || (b[at + 4] & 0x7f) !== 0) return null;
  return (b[p] << 12) | (b[p + 1] << 4) | (b[p + 2] >> 4);
}

function oggRate(b: Uint8Array): number | null {
  if (b.length < 28) return null;
  const packet = 27 + b[26]; // page header, then one lacing byte per segment
  if (ascii(b, packet, '\x01vorbis')) return packet + 16 <= b.length ? u32le(b, packet + 12) : null;
  if (ascii(b, packet, 'OpusHead')) return 48000; // Opus decoders output 48 kHz whatever the input rate field says
  return null;
}

function mpegRate(b: Uint8Array): number | null {
  let at = 0;
  if (ascii(b, 0, 'ID3') && b.length >= 10) {
    const size = ((b[6] & 0x7f) << 21) | ((b[7] & 0x7f) << 14) | ((b[8] & 0x7f) << 7) | (b[9] & 0x7f);
    at = 10 + size + (b[5] & 0x10 ? 10 : 0);
    if (ascii(b, at, 'fLaC')) return flacRate(b, at);
  }
  // The first frame sync within 4 KiB after the tag: 11 set bits, a valid version, a layer (not 0: that is ADTS).
  for (const end = Math.min(b.length - 3, at + 4096); at < end; at++) {
    if (b[at] !== 0xff || (b[at + 1] & 0xe0) !== 0xe0) continue;
    const version = (b[at + 1] >> 3) & 3;
    const layer = (b[at + 1] >> 1) & 3;
    const index = (b[at + 2] >> 2) & 3;
    const bitrate = b[at + 2] >> 4;
    if (version === 1 || layer === 0 || index === 3 || bitrate === 15) continue;
    return MPEG_RATES[version][index];
  }
  return null;
}

/**
 * The sample rate in Hz that `bytes` decode at, read from the header (WAV, FLAC, Ogg Vorbis, Ogg Opus, MP3), or null
 * for other formats (AAC/MP4, WebM…) and unreadable headers.
 */
export function audioFileSampleRate(bytes: ArrayBuffer | Uint8Array): number | null {
  const b = bytes instanceof Uint8Array ? bytes : new Uint8Array(bytes);
  let rate: number | null = null;
  if ((ascii(b, 0, 'RIFF') || ascii(b, 0, 'RF64') || ascii(b, 0, 'BW64')) && ascii(b, 8, 'WAVE')) rate = wavRate(b);
  else if (ascii(b, 0, 'fLaC')) rate = flacRate(b, 0);
  else if (ascii(b, 0, 'OggS')) rate = oggRate(b);
  else rate = mpegRate(b);
  return rate !== null && Number.isInteger(rate) && rate > 0 ? rate : null;
}
