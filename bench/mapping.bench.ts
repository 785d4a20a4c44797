// Mapping benchmark: 1,000 positioned sources of one gameplay snapshot → per-voice targets with TargetMapper,
// µs per frame and heap growth over 10,000 frames, beside a naive allocating mapping measured in the same run.
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { PerformanceObserver } from 'node:perf_hooks';
import { TargetMapper, createVoiceTargets, distanceGain, equalPowerGains, azimuthDegrees, type VoiceInput } from '../src/dilation';
import { dopplerRatio, speedOfSound } from '../src/motion';
import { defaultTuning, type Tuning } from '../src/tuning';
import type { GameplaySnapshot, VoiceTargets } from '../src/dilation';

const SOURCES = 1000;
const TIMED_FRAMES = 2000;
const HEAP_FRAMES = 10000;
const WARMUP_FRAMES = 500;
const GROUPS = ['effects', 'vehicles', 'ambience', 'interface', 'music'];

/** A garbage-collect function: global.gc when exposed, otherwise enabled at run time through V8 flags. */
function getGc(): () => void {
  const g = (globalThis as { gc?: () => void }).gc;
  if (typeof g === 'function') return g;
  setFlagsFromString('--expose-gc');
  return runInNewContext('gc') as () => void;
}

function makeSnapshot(): GameplaySnapshot {
  const sources = [];
  // Deterministic invented scene: sources on a spiral around the listener, moving tangentially.
  for (let i = 0; i < SOURCES; i++) {
    const a = i * 2.399963;
    const r = 2 + (i % 97);
    sources.push({
      id: i,
      position: { x: r * Math.cos(a), y: (i % 7) - 3, z: r * Math.sin(a) },
      velocity: { x: -20 * Math.sin(a), y: 0, z: 20 * Math.cos(a) },
    });
  }
  return {
    time: 0,
    timeScale: 0.35,
    listener: { position: { x: 0, y: 1.7, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 }, velocity: { x: 0, y: 0, z: -3 } },
    sources,
  };
}

/** Time scale of frame k: sweeps 0.3…1 so every curve segment is visited (precomputed: no boxing in the loop). */
const SCALES = new Float64Array(1000).map((_, k) => 0.3 + 0.7 * (0.5 + 0.5 * Math.sin(k * 0.01)));
/** Receives results so the work cannot be optimised away. */
const sink = new Float64Array(1);

/** One frame with TargetMapper: reused inputs and outputs, nothing allocated. */
function mapperFrame(mapper: TargetMapper, inputs: VoiceInput[], out: VoiceTargets[], k: number): void {
  const s = SCALES[k % SCALES.length];
  for (let i = 0; i < SOURCES; i++) {
    const inp = inputs[i];
    inp.timeScale = s;
    mapper.map(out[i], inp);
  }
  sink[0] += out[k % SOURCES].ratio;
}

/** Reference: the same mapping written the obvious way, allocating objects per voice per frame. */
function naiveFrame(tuning: Tuning, snap: GameplaySnapshot, k: number): void {
  const s = SCALES[k % SCALES.length];
  let sum = 0;
  const c = tuning.air.speedOfSound ?? speedOfSound(tuning.air.temperatureCelsius);
  const l = snap.listener;
  for (let i = 0; i < SOURCES; i++) {
    const src = snap.sources[i];
    const g = tuning.groups[GROUPS[i % GROUPS.length]];
    const follows = g.policy === 'follow-time';
    const lerp = (keys: readonly { x: number; y: number }[], x: number) => {
      const ks = [...keys].sort((a, b) => a.x - b.x);
      if (x <= ks[0].x) return ks[0].y;
      const j = ks.findIndex((k) => k.x >= x);
      if (j < 0) return ks[ks.length - 1].y;
      const a = ks[j - 1];
      const b = ks[j];
      return a.y + ((b.y - a.y) * (x - a.x)) / (b.x - a.x);
    };
    const pitch = follows ? lerp(g.pitch.keys, s) : 1;
    const rel = { x: src.position.x - l.position.x, y: src.position.y - l.position.y, z: src.position.z - l.position.z };
    const d = Math.hypot(rel.x, rel.y, rel.z);
    const dir = { x: rel.x / d, y: rel.y / d, z: rel.z / d };
    const f = l.forward;
    const u = l.up;
    const right = { x: f.y * u.z - f.z * u.y, y: f.z * u.x - f.x * u.z, z: f.x * u.y - f.y * u.x };
    const pan = equalPowerGains(azimuthDegrees(dir, f, right), new Float64Array(2));
    const dist = distanceGain(tuning.distance.model, d, tuning.distance.refDistance, tuning.distance.maxDistance, tuning.distance.rolloffFactor);
    const doppler = g.doppler ? dopplerRatio({ ...src, velocity: { ...src.velocity! } }, { position: l.position, velocity: { ...l.velocity! } }, { speedOfSound: c, dopplerFactor: tuning.doppler.factor }) : 1;
    const t = { ratio: pitch * doppler, cutoffHz: lerp(g.tone.keys, s), gain: Math.pow(10, lerp(g.level.keys, s) / 20), left: dist * pan[0], right: dist * pan[1] };
    sum += t.ratio + t.cutoffHz * 0 + t.gain * 0 + t.left * 0 + t.right * 0;
  }
  sink[0] += sum;
}

/** Runs `frames` frames synchronously; mean µs per frame. */
function loop(frames: number, frame: (k: number) => void): number {
  const t0 = performance.now();
  for (let k = 0; k < frames; k++) frame(k);
  return ((performance.now() - t0) * 1000) / frames;
}

/** Mean µs per frame of `frame` over `frames` frames, best of three passes, with the GC count of the best pass. */
async function time(frames: number, frame: (k: number) => void): Promise<{ us: number; gcs: number }> {
  let best = Infinity;
  let bestGcs = 0;
  for (let pass = 0; pass < 3; pass++) {
    let gcs = 0;
    const obs = new PerformanceObserver((list) => (gcs += list.getEntries().length));
    obs.observe({ entryTypes: ['gc'] });
    const us = loop(frames, frame);
    await new Promise((r) => setTimeout(r, 10));
    obs.disconnect();
    if (!(sink[0] > 0)) throw new Error('benchmark produced no output');
    if (us < best) {
      best = us;
      bestGcs = gcs;
    }
  }
  return { us: best, gcs: bestGcs };
}

/** Heap growth (bytes, after forced GC) over `frames` frames following a warm-up. */
function heapGrowth(gc: () => void, frames: number, frame: (k: number) => void): number {
  for (let k = 0; k < WARMUP_FRAMES; k++) frame(k);
  gc();
  gc();
  const before = process.memoryUsage().heapUsed;
  for (let k = 0; k < frames; k++) frame(k);
  gc();
  gc();
  const after = process.memoryUsage().heapUsed;
  if (!(sink[0] > 0)) throw new Error('benchmark produced no output');
  return after - before;
}

/** Runs the mapping benchmark; prints a table unless options.json. */
export async function run(options: { json: boolean }): Promise<object> {
  const gc = getGc();
  const tuning = defaultTuning;
  const snap = makeSnapshot();
  const mapper = new TargetMapper({ tuning });
  const out = snap.sources.map(() => createVoiceTargets());
  const inputs: VoiceInput[] = snap.sources.map((src, i) => ({
    timeScale: snap.timeScale,
    group: GROUPS[i % GROUPS.length],
    baseRatio: 1,
    gain: 1,
    listener: snap.listener as VoiceInput['listener'],
    source: src as NonNullable<VoiceInput['source']>,
  }));
  const mapperStep = (k: number) => mapperFrame(mapper, inputs, out, k);
  const naiveStep = (k: number) => naiveFrame(tuning, snap, k);

  for (let k = 0; k < WARMUP_FRAMES; k++) mapperStep(k);
  const fast = await time(TIMED_FRAMES, mapperStep);
  for (let k = 0; k < WARMUP_FRAMES / 5; k++) naiveStep(k);
  const naive = await time(TIMED_FRAMES / 4, naiveStep);
  const growMapper = heapGrowth(gc, HEAP_FRAMES, mapperStep);
  const growNaive = heapGrowth(gc, HEAP_FRAMES / 10, naiveStep);

  const result = {
    sources: SOURCES,
    usPerFrame: +fast.us.toFixed(1),
    goalUsPerFrame: 200,
    nsPerVoice: +((fast.us * 1000) / SOURCES).toFixed(1),
    gcsPer1000Frames: +((fast.gcs * 1000) / TIMED_FRAMES).toFixed(1),
    naiveUsPerFrame: +naive.us.toFixed(1),
    naiveGcsPer1000Frames: +((naive.gcs * 1000) / (TIMED_FRAMES / 4)).toFixed(1),
    speedupVsNaive: +(naive.us / fast.us).toFixed(2),
    heapGrowthBytesOver10000Frames: growMapper,
    naiveHeapGrowthBytesOver1000Frames: growNaive,
    clamps: mapper.clamps,
  };
  if (!options.json) {
    console.log(`| mapping of ${SOURCES} sources per frame | µs/frame | GCs per 1000 frames |`);
    console.log('| --- | --- | --- |');
    console.log(`| TargetMapper (goal ≤ 200 µs) | ${result.usPerFrame} | ${result.gcsPer1000Frames} |`);
    console.log(`| naive allocating mapping (reference, same run) | ${result.naiveUsPerFrame} | ${result.naiveGcsPer1000Frames} |`);
    console.log(`\nspeed-up vs reference: ${result.speedupVsNaive}×; ${result.nsPerVoice} ns per voice`);
    console.log(`heap growth after GC: TargetMapper over ${HEAP_FRAMES} frames ${growMapper} B; reference over ${HEAP_FRAMES / 10} frames ${growNaive} B`);
  }
  return result;
}
