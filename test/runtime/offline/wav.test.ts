import { describe, expect, it } from 'vitest';
import { readWav, writeWav, WavError, type WavEncoding } from '../../../runtime/offline/wav';

// Builds a canonical 44-byte-header WAV by hand (RIFF WAVE layout, Microsoft/IBM Multimedia
// Programming Interface and Data Specifications 1.0, 1991 — field order from memory).
function handMade(format: number, channels: number, rate: number, bits: number, data: number[], extensible = false): Uint8Array {
  const fmtSize = extensible ? 40 : 16;
  const bytes = new Uint8Array(12 + 8 + fmtSize + 8 + data.length);
  const v = new DataView(bytes.buffer);
  const put = (o: number, s: string) => [...s].forEach((ch, i) => v.setUint8(o + i, ch.charCodeAt(0)));
  put(0, 'RIFF');
  v.setUint32(4, bytes.length - 8, true);
  put(8, 'WAVE');
  put(12, 'fmt ');
  v.setUint32(16, fmtSize, true);
  v.setUint16(20, extensible ? 0xfffe : format, true);
  v.setUint16(22, channels, true);
  v.setUint32(24, rate, true);
  v.setUint32(28, (rate * channels * bits) / 8, true);
  v.setUint16(32, (channels * bits) / 8, true);
  v.setUint16(34, bits, true);
  if (extensible) {
    v.setUint16(36, 22, true);
    v.setUint16(38, bits, true);
    v.setUint32(40, 3, true);
    v.setUint16(44, format, true);
  }
  const d = 20 + fmtSize;
  put(d, 'data');
  v.setUint32(d + 4, data.length, true);
  data.forEach((b, i) => v.setUint8(d + 8 + i, b));
  return bytes;
}

describe('readWav', () => {
  it('decodes hand-made 16-bit PCM little-endian samples (full scale −32768 → −1)', () => {
    const wav = readWav(handMade(1, 2, 44100, 16, [0xff, 0x7f, 0x00, 0x80, 0x00, 0x40, 0x00, 0x00]));
    expect(wav.sampleRate).toBe(44100);
    expect(wav.encoding).toBe('pcm16');
    expect(Array.from(wav.channels[0])).toEqual([32767 / 32768, 0.5]);
    expect(Array.from(wav.channels[1])).toEqual([-1, 0]);
  });

  it('decodes hand-made 24-bit PCM with sign extension', () => {
    const wav = readWav(handMade(1, 1, 48000, 24, [0x00, 0x00, 0x80, 0xff, 0xff, 0x7f, 0x00, 0x00, 0x40]));
    expect(Array.from(wav.channels[0])).toEqual([-1, 8388607 / 8388608, 0.5]);
  });

  it('decodes 32-bit float inside a WAVE_FORMAT_EXTENSIBLE header', () => {
    const f = new Uint8Array(new Float32Array([0.25, -0.75]).buffer);
    const wav = readWav(handMade(3, 1, 96000, 32, Array.from(f), true));
    expect(wav.encoding).toBe('float32');
    expect(Array.from(wav.channels[0])).toEqual([0.25, -0.75]);
  });

  it.each([
    ['8-bit PCM', handMade(1, 1, 8000, 8, [128, 129]), /8-bit integer PCM/],
    ['64-bit float', handMade(3, 1, 8000, 64, new Array(16).fill(0)), /64-bit float/],
    ['A-law', handMade(6, 1, 8000, 8, [0, 0]), /format tag 6/],
  ])('refuses %s with an unsupported-encoding message', (_name, bytes, pattern) => {
    expect(() => readWav(bytes)).toThrow(WavError);
    expect(() => readWav(bytes)).toThrow(pattern);
  });

  it.each([
    ['an empty file', new Uint8Array(0), /not a WAV file/],
    ['a text file', new TextEncoder().encode('hello, this is not audio at all'), /RIFF\/WAVE/],
    ['a file cut inside the data', handMade(1, 1, 8000, 16, [1, 2, 3, 4]).slice(0, 46), /truncated/],
    ['a file cut inside the fmt chunk', handMade(1, 1, 8000, 16, [1, 2]).slice(0, 24), /fmt/],
  ])('refuses %s with a clear message', (_name, bytes, pattern) => {
    expect(() => readWav(bytes)).toThrow(WavError);
    expect(() => readWav(bytes)).toThrow(pattern);
  });
});

describe('writeWav', () => {
  const signal = [new Float32Array([0, 0.5, -0.5, 0.999, -1, 0.123456]), new Float32Array([1, -1, 0.25, 0, 0.3, -0.3])];
  it.each<[WavEncoding, number, number]>([
    ['pcm16', 1 / 32768, 1], // TPDF dither adds at most ±1 step before rounding
    ['pcm24', 1 / 8388608, 0],
    ['float32', 0, 0],
  ])('round-trips %s within half a quantisation step plus its dither (+1 within one step more: it clamps to the largest code)', (encoding, step, dither) => {
    const back = readWav(writeWav({ sampleRate: 22050, channels: signal, encoding }));
    expect(back.encoding).toBe(encoding);
    expect(back.sampleRate).toBe(22050);
    for (let c = 0; c < 2; c++)
      for (let i = 0; i < signal[c].length; i++) {
        // Rounding to the nearest code errs by at most step/2; +1 clamps to the largest code, 1 − step.
        const bound = (signal[c][i] === 1 ? step : step / 2) + dither * step;
        expect(Math.abs(back.channels[c][i] - signal[c][i])).toBeLessThanOrEqual(bound + 1e-12);
      }
  });

  it('writes the canonical 44-byte header followed by the data', () => {
    const bytes = writeWav({ sampleRate: 8000, channels: [new Float32Array(3)], encoding: 'pcm16' });
    expect(bytes.length).toBe(44 + 6);
    const v = new DataView(bytes.buffer);
    expect(v.getUint32(4, true)).toBe(bytes.length - 8);
    expect(v.getUint32(28, true)).toBe(16000); // byte rate = rate × block align
    expect(v.getUint32(40, true)).toBe(6);
  });

  it('clamps integer encodings and writes NaN as silence (pcm16: within its ±1-step dither)', () => {
    const back = readWav(writeWav({ sampleRate: 8000, channels: [new Float32Array([4, -4, NaN])], encoding: 'pcm24' }));
    expect(Array.from(back.channels[0])).toEqual([8388607 / 8388608, -1, 0]);
    const b16 = readWav(writeWav({ sampleRate: 8000, channels: [new Float32Array([4, -4, NaN])], encoding: 'pcm16' }));
    expect(Array.from(b16.channels[0]).slice(0, 2)).toEqual([32767 / 32768, -1]);
    expect(Math.abs(b16.channels[0][2])).toBeLessThanOrEqual(1 / 32768);
  });

  // TPDF dither of ±1 step makes the first two moments of the total error independent of the signal: mean 0 and
  // variance Δ²/12 + Δ²/6 = Δ²/4 (Lipshitz, Wannamaker & Vanderkooy, JAES 40(5) 1992; docs/references.md §19.1).
  it.each([0, 0.3, 0.5, -0.77])('dithers 16-bit output by TPDF: error mean 0 and variance Δ²/4 for a constant %s step off a code', (offset) => {
    const n = 200_000;
    const step = 1 / 32768;
    const x = new Float32Array(n).fill((1000 + offset) * step);
    const back = readWav(writeWav({ sampleRate: 8000, channels: [x], encoding: 'pcm16' })).channels[0];
    let sum = 0;
    let sq = 0;
    for (let i = 0; i < n; i++) {
      const e = (back[i] - x[i]) / step;
      sum += e;
      sq += e * e;
    }
    const mean = sum / n;
    expect(Math.abs(mean)).toBeLessThan(0.01);
    expect(sq / n - mean * mean).toBeCloseTo(0.25, 1);
  });
});

describe('WAV input sanity', () => {
  it.each([1, 7999, 384001, 4294967295])('refuses a file at %i Hz, naming the supported range', (rate) => {
    expect(() => readWav(handMade(1, 1, rate, 16, [0, 0]))).toThrow(/outside the supported 8000…384000 Hz/);
  });

  it.each([8000, 384000])('reads a file at %i Hz', (rate) => {
    expect(readWav(handMade(1, 1, rate, 16, [0, 0])).sampleRate).toBe(rate);
  });

  it.each([44100.5, 0, 5e9, NaN])('refuses to write sample rate %s', (rate) => {
    expect(() => writeWav({ sampleRate: rate, channels: [new Float32Array(2)] })).toThrow(WavError);
  });

  it('clamps float samples beyond ±16 (+24 dBFS) and replaces non-finite ones by 0, counting both', () => {
    const f = new Uint8Array(new Float32Array([1e30, -1e30, NaN, Infinity, 15.5, -0.25]).buffer);
    const wav = readWav(handMade(3, 1, 48000, 32, Array.from(f)));
    expect(Array.from(wav.channels[0])).toEqual([16, -16, 0, 16, 15.5, -0.25]);
    expect(wav.clamped).toBe(4);
  });
});

describe('WAV chunk walking', () => {
  it('refuses a file with more than 4096 chunks before its data instead of crawling them', () => {
    const head = new Uint8Array(12 + 5000 * 8);
    const v = new DataView(head.buffer);
    head.set([0x52, 0x49, 0x46, 0x46], 0); // RIFF
    v.setUint32(4, head.length - 8, true);
    head.set([0x57, 0x41, 0x56, 0x45], 8); // WAVE
    for (let i = 0; i < 5000; i++) head.set([0x4a, 0x55, 0x4e, 0x4b], 12 + 8 * i); // empty "JUNK" chunks
    expect(() => readWav(head)).toThrow(/more than 4096 chunks/);
  });
});
