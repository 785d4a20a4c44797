// Regression guard of the engine restructuring: fixed scenes rendered with the default tuning hash to the same
// SHA-256 as before. This is not a reference check (the expectation is an earlier output of this engine); it proves
// that a change meant to keep behaviour kept every sample. A change that is meant to alter the sound updates the
// table with `UPDATE_RENDER_HASHES=1 npx vitest run test/engine/render-hashes.test.ts` and says why in its commit.
import { createHash } from 'node:crypto';
import { readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { Engine } from '../../src/engine';
import type { KernelPreference } from '../../src/index';
import { loadSceneFile, SceneRun } from '../../runtime/offline';

const TABLE = fileURLToPath(new URL('./render-hashes.json', import.meta.url));
const EXAMPLES = fileURLToPath(new URL('../../runtime/offline/examples/', import.meta.url));
const update = process.env.UPDATE_RENDER_HASHES === '1';
const known: Record<string, string> = update ? {} : JSON.parse(readFileSync(TABLE, 'utf8'));
const found: Record<string, string> = {};

function digest(chunks: Float32Array[]): string {
  const h = createHash('sha256');
  for (const c of chunks) h.update(new Uint8Array(c.buffer, c.byteOffset, c.byteLength));
  return h.digest('hex');
}

/** A seeded tone with a few partials and a click, `seconds` long at `rate`. */
function tone(hz: number, rate: number, seconds: number, seed: number): Float32Array {
  const x = new Float32Array(Math.round(seconds * rate));
  let s = seed >>> 0;
  for (let i = 0; i < x.length; i++) {
    s = (s * 1664525 + 1013904223) >>> 0;
    const t = i / rate;
    x[i] = 0.3 * Math.sin(2 * Math.PI * hz * t) + 0.1 * Math.sin(2 * Math.PI * 3 * hz * t) + 0.01 * (s / 4294967296 - 0.5);
  }
  x[Math.floor(x.length / 3)] += 0.5;
  return x;
}

/**
 * Every voice path the engine has: moving sources (propagation), a listener-only group, a stretched voice, an
 * exempt voice, a time-scale ramp down and back, pause/resume, seek, stop, a tier switch; 3 s at 48 kHz.
 */
function engineScene(kernel: KernelPreference): Float32Array[] {
  const sr = 48000;
  const engine = new Engine({ sampleRate: sr, kernel });
  const a = engine.addSound([tone(220, 44100, 1.5, 1)], 44100);
  const b = engine.addSound([tone(330, 48000, 2, 2), tone(331, 48000, 2, 3)], 48000);
  const c = engine.addSound([tone(500, 22050, 0.4, 4)], 22050);
  const snap = (t: number) => ({
    time: t,
    listener: { position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } },
    sources: [
      { id: 1, position: { x: -60 + 40 * t, y: 0, z: -5 } },
      { id: 2, position: { x: 10 * Math.cos(3 * t), y: 1, z: 10 * Math.sin(3 * t) } },
      { id: 3, position: { x: 3, y: 0, z: -30 + 25 * t } },
    ],
  });
  engine.pushSnapshot(snap(0));
  const v1 = engine.play(a, { group: 'vehicles', loop: true, sourceId: 1 });
  const v2 = engine.play(b, { group: 'effects', loop: true, sourceId: 2 });
  engine.play(b, { group: 'radio', loop: true, sourceId: 3, gainDb: -6 });
  engine.play(c, { group: 'interface', loop: true });
  engine.play(a, { group: 'music', loop: true, gainDb: -12 });
  const left = new Float32Array(128);
  const right = new Float32Array(128);
  const out: Float32Array[] = [];
  const blocks = Math.round((3 * sr) / 128);
  for (let k = 0; k < blocks; k++) {
    const t = (k * 128) / sr;
    if (k % 6 === 0) engine.pushSnapshot(snap(t + (6 * 128) / sr));
    if (k === 60) engine.setTimeScale({ target: 0.3, rampSeconds: 0.4, easing: 'smooth' });
    if (k === 400) engine.setTimeScale({ target: 1, rampSeconds: 0.25, easing: 'linear' });
    if (k === 500) engine.pause('effects');
    if (k === 560) engine.resume('effects');
    if (k === 600) engine.seek(v2, 0.5);
    if (k === 700) engine.setVoice(v1, { ratio: 1.5 });
    if (k === 800) engine.setTuning({ ...engine.currentTuning, resampler: { ...engine.currentTuning.resampler, tier: 'high' } });
    if (k === 900) engine.stop(v1, 0.05);
    if (k === 950) engine.play(c, { group: 'effects', sourceId: 2 });
    engine.render([left, right], 128);
    out.push(left.slice(), right.slice());
  }
  return out;
}

function sceneFile(name: string): Float32Array[] {
  const loaded = loadSceneFile(EXAMPLES + name);
  const run = new SceneRun(loaded.script, loaded.sounds, loaded.tuning);
  const out: Float32Array[] = [];
  for (let n = run.step(); n > 0; n = run.step()) out.push(run.left.slice(0, n), run.right.slice(0, n));
  return out;
}

const cases: [string, () => Float32Array[]][] = [
  ['engine scene, TypeScript kernel', () => engineScene('typescript')],
  ['engine scene, default kernel', () => engineScene('auto')],
  ['flyby.json', () => sceneFile('flyby.json')],
  ['slow-motion.json', () => sceneFile('slow-motion.json')],
  ['recorded-flythrough.json', () => sceneFile('recorded-flythrough.json')],
];

describe('rendered scenes keep their samples through a restructuring', () => {
  for (const [name, render] of cases) {
    it(`${name} hashes as recorded`, () => {
      const h = digest(render());
      found[name] = h;
      if (update) writeFileSync(TABLE, JSON.stringify(found, null, 2) + '\n');
      else expect(h).toBe(known[name]);
    }, 120_000);
  }
});
