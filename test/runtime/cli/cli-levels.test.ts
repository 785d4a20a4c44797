// What `bake` and `render` say about levels and rates: clipping counted with its peak, --normalize and --gain,
// 16-bit output dithered, absurd input samples clamped and counted, rates outside 8…384 kHz and fractional rates refused.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { tmpdir } from 'node:os';
import { EXIT } from '../../../runtime/cli/cli-io';
import { readWav, writeWav, wavHeader } from '../../../runtime/offline';
import { runCli } from './run-cli';

const dir = mkdtempSync(join(tmpdir(), 'ralenti-cli-levels-'));
const path = (name: string) => join(dir, name);
const peakDb = (x: Float32Array) => 20 * Math.log10(x.reduce((m, v) => Math.max(m, Math.abs(v)), 0));

beforeAll(() => {
  // A loud square wave (peak 0.9): resampled at 1.7 its band-limited edges overshoot full scale (Gibbs, common practice).
  const sq = new Float32Array(48000).map((_, i) => (Math.floor(i / 60) % 2 ? 0.9 : -0.9));
  writeFileSync(path('square.wav'), writeWav({ sampleRate: 48000, channels: [sq], encoding: 'float32' }));
  const wild = new Float32Array(4800).map((_, i) => (i % 100 === 0 ? 1e30 : 0.25 * Math.sin(i / 10)));
  writeFileSync(path('wild.wav'), writeWav({ sampleRate: 48000, channels: [wild], encoding: 'float32' }));
  const head = Buffer.from(wavHeader(48000, 1, 'pcm16', 100));
  const at = (rate: number) => {
    const b = Buffer.concat([head, Buffer.alloc(200)]);
    b.writeUInt32LE(rate, 24);
    return b;
  };
  writeFileSync(path('rate-1.wav'), at(1));
  writeFileSync(path('rate-max.wav'), at(4294967295));
  writeFileSync(path('scene.json'), JSON.stringify({ version: 1, duration: 0.5, sounds: { t: { type: 'tone', frequency: 440 } }, voices: [{ sound: 't' }] }));
});

afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('clipping and gain', () => {
  it('reports samples above 0 dBFS with their count and peak when a 16-bit bake clips', async () => {
    const r = await runCli(['bake', path('square.wav'), '--speed', '1.7', '--encoding', 'pcm16', '-q', '-o', path('clipped.wav')]);
    expect(r.code).toBe(EXIT.ok);
    expect(r.out).toMatch(/clipping: \d+ sample\(s\) above 0 dBFS \(peak \+\d+\.\d dBFS\), clipped to full scale; use --normalize or --gain -\d+/);
    expect(r.out).toMatch(/pcm16, TPDF dither/);
  });

  it('--normalize puts the peak at −1 dBFS and nothing clips', async () => {
    const r = await runCli(['bake', path('square.wav'), '--speed', '1.7', '--encoding', 'pcm16', '--normalize', '-q', '-o', path('normal.wav')]);
    expect(r.code).toBe(EXIT.ok);
    expect(r.out).toMatch(/clipping: none/);
    const y = readWav(readFileSync(path('normal.wav'))).channels[0];
    expect(Math.abs(peakDb(y) + 1)).toBeLessThan(0.01); // within the 16-bit step and its dither
  });

  it('--gain scales the output by the given decibels', async () => {
    await runCli(['bake', path('square.wav'), '--speed', '1.7', '-q', '-o', path('g0.wav')]);
    await runCli(['bake', path('square.wav'), '--speed', '1.7', '--gain', '-6', '-q', '-o', path('g6.wav')]);
    const a = readWav(readFileSync(path('g0.wav'))).channels[0];
    const b = readWav(readFileSync(path('g6.wav'))).channels[0];
    expect(peakDb(a) - peakDb(b)).toBeCloseTo(6, 4);
  });

  it('refuses --gain together with --normalize', async () => {
    const r = await runCli(['bake', path('square.wav'), '--speed', '1.7', '--gain', '-3', '--normalize', '-o', path('x.wav')]);
    expect(r.code).toBe(EXIT.usage);
  });

  it('render reports clipping, blasts and takes --normalize', async () => {
    const r = await runCli(['render', path('scene.json'), '--normalize', '-q', '-o', path('scene.wav')]);
    expect(r.code).toBe(EXIT.ok);
    expect(r.out).toMatch(/clipping: none/);
    expect(r.out).toMatch(/blasts muted: 0/);
    const y = readWav(readFileSync(path('scene.wav'))).channels[0];
    expect(Math.abs(peakDb(y) + 1)).toBeLessThan(1e-4);
  });
});

describe('output safety in a render with the limiter off', () => {
  it('a hostile scene (64 loud tones, limiter off) never exceeds 0 dBFS and reports the blast guard muting it', async () => {
    const tuning = JSON.parse(readFileSync('runtime/offline/examples/slow-motion.tuning.json', 'utf8'));
    tuning.master = { limiter: false, ceilingDb: -1, gainDb: 12 };
    const voices = Array.from({ length: 64 }, () => ({ sound: 't', gain: 1, loop: true, group: 'interface' }));
    writeFileSync(path('hostile.json'), JSON.stringify({ version: 1, duration: 1, tuning, sounds: { t: { type: 'tone', frequency: 110, gain: 1 } }, voices }));
    const r = await runCli(['render', path('hostile.json'), '-q', '-o', path('hostile.wav')]);
    expect(r.code).toBe(EXIT.ok);
    expect(r.out).toMatch(/blasts muted: 1/);
    const [l, rr] = readWav(readFileSync(path('hostile.wav'))).channels;
    expect(Math.max(peakDb(l), peakDb(rr))).toBeLessThanOrEqual(0);
  });
});

describe('input sanity', () => {
  it('clamps input samples of ±1e30 to ±16 and says how many', async () => {
    const r = await runCli(['bake', path('wild.wav'), '--speed', '0.5', '-q', '-o', path('wild-out.wav')]);
    expect(r.code).toBe(EXIT.ok);
    expect(r.out).toMatch(/input: 48 sample\(s\) beyond ±16 \(\+24 dBFS\) or not finite were clamped/);
    expect(r.out).not.toMatch(/peak 6\d\d/);
  });

  it.each(['rate-1.wav', 'rate-max.wav'])('refuses %s: its sample rate is outside 8000…384000 Hz', async (name) => {
    const r = await runCli(['bake', path(name), '--speed', '0.5', '-q', '-o', path('never.wav')]);
    expect(r.code).toBe(EXIT.input);
    expect(r.err).toMatch(/outside the supported 8000…384000 Hz/);
  });

  it.each([['render'], ['check']])('%s refuses a fractional --rate instead of rounding it', async (verb) => {
    const r = await runCli([verb, path('scene.json'), '--rate', '44100.5', '-q', ...(verb === 'render' ? ['-o', path('never.wav')] : [])]);
    expect(r.code).toBe(EXIT.usage);
    expect(r.err).toMatch(/whole number of hertz/);
  });
});
