// Sample rates read from audio file headers, on headers written byte by byte from the formats' specifications
// (docs/references.md §17).
import { describe, expect, it } from 'vitest';
import { readAudioFileRate } from '../../editor/audio-file-rate';

function bytes(...parts: (string | number[])[]): Uint8Array {
  const out: number[] = [];
  for (const p of parts) out.push(...(typeof p === 'string' ? [...p].map((c) => c.charCodeAt(0)) : p));
  return new Uint8Array(out);
}
const u32le = (v: number) => [v & 255, (v >> 8) & 255, (v >> 16) & 255, (v >>> 24) & 255];
const u16le = (v: number) => [v & 255, (v >> 8) & 255];

/** RIFF/WAVE with a LIST chunk before "fmt " (docs/references.md §17: chunks are walked, not assumed at byte 12). */
function wav(rate: number): Uint8Array {
  const fmt = [...u16le(1), ...u16le(2), ...u32le(rate), ...u32le(rate * 4), ...u16le(4), ...u16le(16)];
  return bytes('RIFF', u32le(4 + 8 + 3 + 1 + 8 + 16), 'WAVE', 'LIST', u32le(3), 'abc', [0], 'fmt ', u32le(16), fmt, 'data', u32le(0));
}

/** fLaC + STREAMINFO header (last-block flag, type 0, length 34) with a 20-bit rate after 10 bytes. */
function flac(rate: number): Uint8Array {
  const info = new Array(34).fill(0);
  info[10] = (rate >> 12) & 255;
  info[11] = (rate >> 4) & 255;
  info[12] = ((rate & 15) << 4) | 0x02; // low rate nibble, then channels-1 (1 = stereo) in the next bits
  return bytes('fLaC', [0x80, 0, 0, 34], info);
}

/** One Ogg page (27-byte header, one segment) carrying a Vorbis identification header or an OpusHead. */
function ogg(packet: Uint8Array): Uint8Array {
  const header = bytes('OggS', [0, 2], new Array(8).fill(0), new Array(12).fill(0), [1, packet.length]);
  const out = new Uint8Array(header.length + packet.length);
  out.set(header);
  out.set(packet, header.length);
  return out;
}
const vorbisId = (rate: number) => bytes([1], 'vorbis', u32le(0), [2], u32le(rate), u32le(0), u32le(128000), u32le(0), [0xb8, 1]);
const opusHead = (inputRate: number) => bytes('OpusHead', [1, 2], u16le(312), u32le(inputRate), u16le(0), [0]);

/** ID3v2 tag (syncsafe size 20) then an MPEG audio frame header: sync, version bits, layer III, rate index. */
function mp3(versionBits: number, rateIndex: number): Uint8Array {
  const frame = [0xff, 0xe0 | (versionBits << 3) | (1 << 1) | 1, (9 << 4) | (rateIndex << 2), 0x44];
  return bytes('ID3', [4, 0, 0, 0, 0, 0, 20], new Array(20).fill(0), frame, new Array(32).fill(0));
}

describe('readAudioFileRate', () => {
  it.each([
    ['WAV 22050', wav(22050), 22050, 'wav'],
    ['WAV 96000', wav(96000), 96000, 'wav'],
    ['FLAC 44100', flac(44100), 44100, 'flac'],
    ['FLAC 192000', flac(192000), 192000, 'flac'],
    ['Ogg Vorbis 32000', ogg(vorbisId(32000)), 32000, 'ogg-vorbis'],
    ['Ogg Opus (decoded at 48 kHz whatever the input rate)', ogg(opusHead(44100)), 48000, 'ogg-opus'],
    ['MPEG-1 layer III 44100', mp3(3, 0), 44100, 'mp3'],
    ['MPEG-1 layer III 32000', mp3(3, 2), 32000, 'mp3'],
    ['MPEG-2 layer III 24000', mp3(2, 1), 24000, 'mp3'],
    ['MPEG-2.5 layer III 8000', mp3(0, 2), 8000, 'mp3'],
  ] as const)('reads %s', (_name, b, rate, format) => {
    expect(readAudioFileRate(b)).toEqual({ sampleRate: rate, format });
  });

  it('says unknown (no rate) for bytes it does not recognise', () => {
    expect(readAudioFileRate(bytes('not audio at all'))).toEqual({ sampleRate: null, format: 'unknown' });
    expect(readAudioFileRate(new Uint8Array(0))).toEqual({ sampleRate: null, format: 'unknown' });
  });
});
