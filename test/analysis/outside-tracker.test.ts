// The checker's pitch tracker (src/analysis YIN) against an outside implementation: aubio's YIN (`aubiopitch -p yin`,
// Debian package aubio-tools, installed by .ci/run), on synthetic glides and on speech from espeak-ng (Debian package
// espeak-ng). Both trackers get the same frames: aubio analyses a buffer of B samples ending at each hop with the YIN
// integration window B/2 and lags below B/2 (docs/references.md §14a; speech: §14b); ours gets W = B/2, lags down to sr/(B/2) Hz,
// and the signal with B − H zeros in front, so that its frame i reads the very samples of aubio's frame i.
import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { tmpdir } from 'node:os';
import { PitchTracker } from '../../src/analysis';
import { readWav, writeWav } from '../../runtime/offline';

const B = 1024;
const H = 256;

function aubio(path: string): number[] {
  const text = execFileSync('aubiopitch', ['-i', path, '-p', 'yin', '-B', String(B), '-H', String(H), '-l', '0.1', '-s', '-60'], { encoding: 'utf8' });
  return text.trim().split('\n').map((line) => Number(line.trim().split(/\s+/)[1]));
}

function ours(signal: Float32Array, sr: number): { f: Float64Array; p: Float64Array } {
  const padded = new Float32Array(signal.length + B - H);
  padded.set(signal, B - H);
  const tracker = new PitchTracker({ sampleRate: sr, hopSeconds: H / sr, windowSeconds: B / 2 / sr, minHz: sr / (B / 2), maxHz: Math.min(sr / 4, 2000), threshold: 0.1 });
  const t = tracker.track(padded);
  return { f: t.frequencies, p: t.periodicities };
}

/** |cents| between the trackers on frames both call voiced (ours with periodicity ≥ 0.9, aubio's above 0). */
function compare(signal: Float32Array, sr: number, dir: string): number[] {
  const path = join(dir, 'x.wav');
  writeFileSync(path, writeWav({ sampleRate: sr, channels: [signal], encoding: 'pcm16' }));
  const a = aubio(path);
  // Both read the file aubio read (16-bit), so quantisation is the same for both.
  const { f, p } = ours(readWav(readFileSync(path)).channels[0], sr);
  const diffs: number[] = [];
  for (let i = 4; i < Math.min(a.length, f.length); i++) if (a[i] > 0 && a[i] < sr / 4 && f[i] > 0 && p[i] >= 0.9) diffs.push(Math.abs(1200 * Math.log2(f[i] / a[i])));
  return diffs.sort((x, y) => x - y);
}

describe('pitch tracker against aubio YIN', () => {
  const dir = mkdtempSync(join(tmpdir(), 'ralenti-aubio-'));
  const sr = 22050;
  const glide = (f0: number, f1: number, seconds: number, partials: number[]) => {
    const x = new Float32Array(Math.round(seconds * sr));
    let ph = 0;
    for (let i = 0; i < x.length; i++) {
      ph += (f0 * (f1 / f0) ** (i / x.length)) / sr;
      let v = 0;
      partials.forEach((a, k) => (v += a * Math.sin(2 * Math.PI * (k + 1) * ph)));
      x[i] = 0.4 * v;
    }
    return x;
  };

  it.each([
    ['a sine gliding 150 → 450 Hz over 2 s', glide(150, 450, 2, [1])],
    ['a hum gliding 400 → 120 Hz over 1.5 s', glide(400, 120, 1.5, [1, 0.5, 0.3, 0.15])],
  ])('agrees within 2 cents on every voiced frame of %s', (_name, signal) => {
    const d = compare(signal, sr, dir);
    expect(d.length).toBeGreaterThan(100);
    expect(d[d.length - 1]).toBeLessThan(2);
  });

  it('agrees within 2 cents on every voiced frame of espeak-ng speech', () => {
    const path = join(dir, 'speech.wav');
    execFileSync('espeak-ng', ['-w', path, '-s', '140', 'Every voice is judged as it flies past the listener, closest approach included.']);
    const speech = readWav(readFileSync(path));
    const d = compare(speech.channels[0], speech.sampleRate, dir);
    expect(d.length).toBeGreaterThan(100);
    expect(d[d.length - 1]).toBeLessThan(2);
    rmSync(dir, { recursive: true, force: true });
  });
});
