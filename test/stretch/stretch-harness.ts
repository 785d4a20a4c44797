// Drives a StretchReader offline in 128-frame blocks, and the outside references the stretch checks use:
// espeak-ng renders (speech) and the Rubber Band command-line tool (rubberband-cli), both from Debian's packages.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { KernelTable } from '../../src/dsp';
import { StretchReader } from '../../src/stretch';
import { readWav, writeWav } from '../../runtime/offline';

/** Block size the engine renders in (Web Audio's render quantum). */
export const BLOCK = 128;

/** A stretched render: the output and the stretcher's position (source frames) at the start of every output frame. */
export interface StretchRender {
  output: Float32Array;
  positions: Float64Array;
}

/**
 * Stretches mono `x` at `sampleRate` with read speed speedAt(outputSeconds) and pitch ratio `pitch`, block by block,
 * until the one-shot has finished (or `maxFrames`).
 */
export function stretchOffline(x: Float32Array, sampleRate: number, speedAt: (t: number) => number, pitch = 1, maxFrames = 0): StretchRender {
  const reader = new StretchReader({ table: KernelTable.forTier('standard'), channels: 1, sampleRate });
  reader.setSource([x]);
  const cap = maxFrames > 0 ? maxFrames : Math.ceil(x.length / 0.2) + 4 * BLOCK;
  const out = new Float32Array(cap);
  const positions = new Float64Array(cap);
  const buf = [new Float32Array(BLOCK)];
  let n = 0;
  while (n + BLOCK <= cap && !reader.finished) {
    const s0 = speedAt(n / sampleRate);
    const s1 = speedAt((n + BLOCK) / sampleRate);
    const p0 = reader.position;
    reader.read(buf, 0, BLOCK, s0, s1, pitch, pitch);
    for (let i = 0; i < BLOCK; i++) {
      out[n + i] = buf[0][i];
      positions[n + i] = p0 + s0 * i + ((s1 - s0) * i * (i - 1)) / (2 * BLOCK);
    }
    n += BLOCK;
  }
  return { output: out.subarray(0, n), positions: positions.subarray(0, n) };
}

/** Whether a Debian tool is on PATH. */
export function hasTool(name: string): boolean {
  try {
    execFileSync('sh', ['-c', `command -v ${name}`], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
}

/** Speech from espeak-ng (mono; its native 22050 Hz). */
export function espeakSpeech(text: string, voice = 'en'): { x: Float32Array; sampleRate: number } {
  const dir = mkdtempSync(join(tmpdir(), 'ralenti-speech-'));
  try {
    const file = join(dir, 'speech.wav');
    execFileSync('espeak-ng', ['-v', voice, '-s', '150', '-w', file, text], { stdio: 'ignore' });
    const w = readWav(new Uint8Array(readFileSync(file)));
    return { x: w.channels[0], sampleRate: w.sampleRate };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** The same input stretched by the Rubber Band library's command-line tool at a fixed time scale (default options). */
export function rubberBandStretch(x: Float32Array, sampleRate: number, scale: number): Float32Array {
  const dir = mkdtempSync(join(tmpdir(), 'ralenti-rb-'));
  try {
    const inFile = join(dir, 'in.wav');
    const outFile = join(dir, 'out.wav');
    writeFileSync(inFile, writeWav({ sampleRate, channels: [x], encoding: 'float32' }));
    execFileSync('rubberband', ['-q', '-t', String(1 / scale), inFile, outFile], { stdio: 'ignore' });
    return readWav(new Uint8Array(readFileSync(outFile))).channels[0];
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** Pitch track by aubio's YIN (Debian `aubio-tools`, `aubiopitch`): frame start times (s) and Hz (0 = none); 1024-frame windows, hop 128. */
export function aubioPitch(x: Float32Array, sampleRate: number): { times: number[]; hz: number[] } {
  const dir = mkdtempSync(join(tmpdir(), 'ralenti-aubio-'));
  try {
    const file = join(dir, 'in.wav');
    writeFileSync(file, writeWav({ sampleRate, channels: [x], encoding: 'pcm16' }));
    const text = execFileSync('aubiopitch', ['-i', file, '-p', 'yin', '-H', '128', '-B', '1024', '-s', '-50'], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] });
    const times: number[] = [];
    const hz: number[] = [];
    for (const line of text.trim().split('\n')) {
      const [t, f] = line.trim().split(/\s+/).map(Number);
      if (Number.isFinite(t) && Number.isFinite(f)) {
        times.push(t);
        hz.push(f);
      }
    }
    return { times, hz };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** A harmonic tone with a gentle vibrato-free 1 s body and 50 ms raised-cosine edges, padded with 0.1 s silence. */
export function harmonicBurst(f0: number, sampleRate: number, seconds: number): Float32Array {
  const pad = Math.round(0.1 * sampleRate);
  const body = Math.round(seconds * sampleRate);
  const edge = Math.round(0.05 * sampleRate);
  const x = new Float32Array(body + 2 * pad);
  for (let i = 0; i < body; i++) {
    let s = 0;
    for (let k = 1; k <= 8 && k * f0 < sampleRate / 2; k++) s += (0.4 / k) * Math.sin((2 * Math.PI * k * f0 * i) / sampleRate + 0.7 * k);
    const e = i < edge ? 0.5 - 0.5 * Math.cos((Math.PI * i) / edge) : i >= body - edge ? 0.5 - 0.5 * Math.cos((Math.PI * (body - 1 - i)) / edge) : 1;
    x[pad + i] = s * e;
  }
  return x;
}

/** First and last sample index where the 5 ms RMS (1 ms steps) exceeds `thresholdDb` relative to its peak. */
export function audibleSpan(x: Float32Array, sampleRate: number, thresholdDb = -20): [number, number] {
  const w = Math.round(0.005 * sampleRate);
  const step = Math.max(1, Math.round(0.001 * sampleRate));
  const frames = Math.max(0, Math.floor((x.length - w) / step) + 1);
  const rms = new Float64Array(frames);
  let peak = 0;
  for (let f = 0; f < frames; f++) {
    let e = 0;
    for (let i = 0; i < w; i++) e += x[f * step + i] ** 2;
    rms[f] = Math.sqrt(e / w);
    peak = Math.max(peak, rms[f]);
  }
  const th = peak * Math.pow(10, thresholdDb / 20);
  let a = 0;
  while (a < frames && rms[a] < th) a++;
  let b = frames - 1;
  while (b > 0 && rms[b] < th) b--;
  return [a * step, b * step + w];
}
