import { describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { tmpdir } from 'node:os';
import { renderScene, loadSceneFile, renderLoadedScene, ScriptError, writeWav } from '../../../runtime/offline';
import { trackPitch, rmsLevel } from '../../../src/analysis';

const examples = resolve(__dirname, '../../../runtime/offline/examples');

describe('renderScene', () => {
  it('renders the straight fly-by with the moving-source Doppler pitch within 5 cents in its steady parts', () => {
    const loaded = loadSceneFile(join(examples, 'flyby.json'));
    const { left, right, sampleRate, stats } = renderLoadedScene(loaded.script, loaded.sounds, loaded.tuning);
    expect(left.length).toBe(10 * sampleRate);
    expect(stats.voicesStarted).toBe(1);
    const mono = new Float32Array(left.length);
    for (let i = 0; i < mono.length; i++) mono[i] = 0.5 * (left[i] + right[i]);
    const track = trackPitch(mono, sampleRate, { hopSeconds: 0.02, minHz: 300, maxHz: 700 });
    // Moving source, listener at rest: f = f0 · c / (c − v_s), v_s the speed toward the listener
    // (OpenStax University Physics 1, §17.7, VERIFIED; docs/references.md §1a) taken at the emission time τ of the
    // sound heard at t: |S(τ)| = c·(t − τ), a quadratic on this straight path (docs/references.md §11).
    // c = 343.3 m/s set in the script.
    const c = 343.3;
    const f0 = 440;
    let checked = 0;
    let worst = 0;
    for (let k = 0; k < track.times.length; k++) {
      const t = track.times[k];
      if (t < 1 || t > 9.5 || Math.abs(t - 5) < 1.5) continue; // steady parts only
      // x(τ) = −200 + 40τ, z = 10: (40² − c²)τ² + 2(c²t − 200·40)τ + 200² + 10² − c²t² = 0, latest root ≤ t.
      const a = 1600 - c * c;
      const b = 2 * (c * c * t - 8000);
      const q = 40100 - c * c * t * t;
      const tau = (-b + Math.sqrt(b * b - 4 * a * q)) / (2 * a);
      const x = -200 + 40 * tau;
      const vs = (40 * -x) / Math.hypot(x, 10);
      const expected = (f0 * c) / (c - vs);
      const cents = 1200 * Math.log2(track.frequencies[k] / expected);
      worst = Math.max(worst, Math.abs(cents));
      checked++;
    }
    expect(checked).toBeGreaterThan(250);
    expect(worst).toBeLessThan(5);
    // And the pitch really moves: approaching vs receding differ by more than two semitones.
    const at = (time: number) => track.frequencies[track.times.findIndex((t) => t >= time)];
    expect(1200 * Math.log2(at(2) / at(8))).toBeGreaterThan(200);
  });

  it('renders the slow-motion example with its tuning file, every sample finite and under the ceiling', () => {
    const progress: number[] = [];
    const loaded = loadSceneFile(join(examples, 'slow-motion.json'));
    const { left, right, stats } = renderLoadedScene(loaded.script, loaded.sounds, loaded.tuning, { sampleRate: 24000, onProgress: (f) => progress.push(f) });
    expect(left.length).toBe(9 * 24000);
    expect(stats.voicesStarted).toBe(8);
    expect(stats.peak).toBeLessThanOrEqual(Math.pow(10, -1 / 20) + 1e-7);
    expect(left.every(Number.isFinite) && right.every(Number.isFinite)).toBe(true);
    expect(rmsLevel(left)).toBeGreaterThan(0.005);
    expect(progress[progress.length - 1]).toBe(1);
    expect(progress.length).toBeLessThanOrEqual(101);
    expect(loaded.tuning.timeFlow.slowMotionScale).toBe(0.25);
  });

  it('gives the same samples on every render of a script', () => {
    const script = JSON.parse(readFileSync(join(examples, 'slow-motion.json'), 'utf8'));
    script.duration = 2;
    const a = renderScene(script, { baseDir: examples, sampleRate: 16000, tier: 'draft' });
    const b = renderScene(script, { baseDir: examples, sampleRate: 16000, tier: 'draft' });
    expect(a.left).toEqual(b.left);
    expect(a.stats.engine.tier).toBe('draft');
  });

  it('plays WAV file sounds at their own sample rate', () => {
    const dir = mkdtempSync(join(tmpdir(), 'ralenti-scene-'));
    const x = new Float32Array(22050).map((_, i) => 0.3 * Math.sin((2 * Math.PI * 500 * i) / 22050));
    writeFileSync(join(dir, 'tone.wav'), writeWav({ sampleRate: 22050, channels: [x], encoding: 'pcm16' }));
    const r = renderScene({ duration: 0.5, sounds: { t: { type: 'file', path: 'tone.wav' } }, voices: [{ sound: 't', group: 'interface' }] }, { baseDir: dir });
    const track = trackPitch(r.left.subarray(2400, 19200), r.sampleRate, { minHz: 200, maxHz: 1000 });
    const f = Array.from(track.frequencies).filter(Number.isFinite);
    expect(f.length).toBeGreaterThan(10);
    expect(Math.abs(1200 * Math.log2(f[Math.floor(f.length / 2)] / 500))).toBeLessThan(1);
  });

  it.each([
    ['a missing WAV file', { duration: 1, sounds: { t: { type: 'file', path: 'nope.wav' } }, voices: [] }, 'sounds.t.path', /ENOENT/],
    ['a non-WAV file', { duration: 1, sounds: { t: { type: 'file', path: 'flyby.json' } }, voices: [] }, 'sounds.t.path', /not a WAV file/],
    ['a missing tuning file', { duration: 1, tuning: 'none.json', voices: [] }, 'tuning', /cannot read the tuning file/],
    ['a bad inline tuning', { duration: 1, tuning: { version: 1, air: { temperatureCelsius: 500, speedOfSound: null } }, voices: [] }, 'tuning.air.temperatureCelsius', /./],
  ])('reports %s as a ScriptError with its JSON path', (_name, script, path, pattern) => {
    let err: unknown;
    try {
      renderScene(script, { baseDir: examples });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(ScriptError);
    const issue = (err as ScriptError).issues.find((i) => i.path === path);
    expect(issue, JSON.stringify((err as ScriptError).issues)).toBeDefined();
    expect(issue!.message).toMatch(pattern);
  });
});
