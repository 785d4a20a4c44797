// The sample rate a file decodes at, read from hand-built headers laid out as each format's specification describes
// (docs/references.md §15): the decoder then runs at that rate and the engine's resampler is the only one.
import { describe, expect, it } from 'vitest';
import { audioFileSampleRate } from '../../runtime/audio-file-rate';

const bytes = (...parts: (string | number[])[]) =>
  Uint8Array.from(parts.flatMap((p) => (typeof p === 'string' ? [...p].map((c) => c.charCodeAt(0)) : p)));
const u16 = (n: number) => [n & 255, (n >> 8) & 255];
const u32 = (n: number) => [n & 255, (n >> 8) & 255, (n >> 16) & 255, (n >>> 24) & 255];

/** RIFF WAVE with an optional chunk before "fmt " (readers must walk the chunk list, §15a). */
const wav = (magic: string, rate: number, before: number[] = []) =>
  bytes(magic, u32(36), 'WAVE', before, 'fmt ', u32(16), u16(1), u16(2), u32(rate), u32(rate * 4), u16(4), u16(16), 'data', u32(0));
/** "fLaC", a STREAMINFO block header (type 0, length 34), then min/max block size, min/max frame size, the 20-bit rate (§15b). */
const flac = (rate: number) =>
  bytes('fLaC', [0x80, 0, 0, 34], [0x10, 0, 0x10, 0], [0, 0, 0, 0, 0, 0], [(rate >> 12) & 255, (rate >> 4) & 255, ((rate & 15) << 4) | 0x02], new Array(27).fill(0));
/** An Ogg page header (27 bytes, one lacing value) followed by the first packet (§15c). */
const ogg = (packet: number[]) => bytes('OggS', [0, 2], new Array(8).fill(0), u32(1), u32(0), u32(0), [1, packet.length], packet);
const vorbisId = (rate: number) => [...bytes('\x01vorbis'), ...u32(0), 2, ...u32(rate), ...u32(0), ...u32(128000), ...u32(0), 0xb8, 1];
const opusHead = (inputRate: number) => [...bytes('OpusHead'), 1, 2, ...u16(312), ...u32(inputRate), 0, 0, 0];
/** An ID3v2.4 tag of `size` bytes (syncsafe size), then an MPEG audio frame header (§15d, §15e). */
const mp3 = (b1: number, b2: number, tagSize = 0) =>
  bytes(tagSize ? ['I'.charCodeAt(0), 'D'.charCodeAt(0), '3'.charCodeAt(0), 4, 0, 0, 0, 0, (tagSize >> 7) & 127, tagSize & 127] : [], new Array(tagSize).fill(0), [0xff, b1, b2, 0x64], new Array(32).fill(0));

describe('audioFileSampleRate reads the rate from the header', () => {
  it.each([
    ['WAV 44.1 kHz, fmt first', wav('RIFF', 44100), 44100],
    ['WAV 22.05 kHz after a LIST chunk', wav('RIFF', 22050, [...bytes('LIST'), ...u32(3), 1, 2, 3, 0]), 22050],
    ['RF64 WAVE 96 kHz', wav('RF64', 96000), 96000],
    ['FLAC 96 kHz', flac(96000), 96000],
    ['FLAC 44.1 kHz', flac(44100), 44100],
    ['Ogg Vorbis 22.05 kHz', ogg(vorbisId(22050)), 22050],
    ['Ogg Opus (input rate field 44.1 kHz; Opus decodes at 48 kHz)', ogg(opusHead(44100)), 48000],
    ['MPEG-1 Layer III 44.1 kHz after an ID3v2 tag', mp3(0xfb, 0x90, 300), 44100],
    ['MPEG-1 Layer III 48 kHz', mp3(0xfb, 0x94), 48000],
    ['MPEG-1 Layer III 32 kHz', mp3(0xfb, 0x98), 32000],
    ['MPEG-2 Layer III 24 kHz', mp3(0xf3, 0x84), 24000],
    ['MPEG-2.5 Layer III 8 kHz', mp3(0xe3, 0x88), 8000],
  ])('%s', (_name, data, rate) => {
    expect(audioFileSampleRate(data)).toBe(rate);
    expect(audioFileSampleRate(data.buffer as ArrayBuffer)).toBe(rate);
  });

  it.each([
    ['AAC in ADTS (layer bits 0)', bytes([0xff, 0xf1, 0x50, 0x80], new Array(16).fill(0))],
    ['MP4 (ftyp box)', bytes(u32(24).reverse(), 'ftypM4A ', new Array(16).fill(0))],
    ['a reserved MPEG sampling index', mp3(0xfb, 0x9c)],
    ['a WAV cut inside its sample-rate field', wav('RIFF', 44100).slice(0, 26)],
    ['an empty file', new Uint8Array(0)],
    ['text', bytes('hello, not audio')],
  ])('gives null for %s (decoded at the context rate instead)', (_name, data) => {
    expect(audioFileSampleRate(data)).toBeNull();
  });
});
