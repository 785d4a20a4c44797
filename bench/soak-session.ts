// Soak session: simulated gameplay rendered offline through the engine — a drone race over a quarry (drones on
// loops, a jet pass now and then, pops and chimes as one-shots), time-scale changes and tuning swaps — with figures.
import { Engine, type EngineSnapshot } from '../src/engine';
import { defaultTuning, parseTuning, serializeTuning, type Tuning } from '../src/tuning';
import { seededRandom } from '../src/random';

/** Options of runSoak. */
export interface SoakOptions {
  /** Simulated seconds to render (> 0). */
  seconds: number;
  /** Seed of the session's random choices. */
  seed?: number;
  /** Collects garbage before a heap reading (global.gc or the V8 flag trick); absent = no collection. */
  gc?: () => void;
  /** Heap in use, bytes; absent = 0 (no heap figures). */
  heapUsed?: () => number;
  /** Wall clock in milliseconds for the real-time factor; absent = no timing (tests). */
  now?: () => number;
  /** Called about every 60 simulated seconds with the fraction done. */
  progress?: (fraction: number) => void;
}

/** What a soak session measured. */
export interface SoakFigures {
  simulatedSeconds: number;
  frames: number;
  snapshots: number;
  plays: number;
  timeScaleChanges: number;
  tuningSwaps: number;
  nonFinite: number;
  /** Output samples above the limiter ceiling of the tuning in use. */
  overCeiling: number;
  peak: number;
  clamps: number;
  steals: number;
  refused: number;
  errors: number;
  /** Heap after collection once the session is warm (5 simulated seconds in), and at the end, bytes. */
  heapStart: number;
  heapEnd: number;
  /** (heapEnd − heapStart) / heapStart. */
  heapChange: number;
  /** Wall seconds spent, and simulated ÷ wall (NaN without a clock). */
  wallSeconds: number;
  realTimeFactor: number;
}

const SR = 48000;
const BLOCK = 128;
/** A gameplay frame every 6 blocks (16 ms, about 60 Hz). */
const SNAPSHOT_BLOCKS = 6;
const DRONES = 12;
const JET = 100;

const prng = seededRandom;

/** Generated sounds: a buzzing rotor loop, a jet roar loop (noise), a pop, a chime, wind (stereo noise loop). */
function sounds(random: () => number): { channels: Float32Array[]; rate: number }[] {
  const n = (s: number, rate = SR) => Math.round(s * rate);
  const rotor = new Float32Array(n(0.5)).map((_, i) => 0.2 * Math.sin((2 * Math.PI * 120 * i) / SR) + 0.1 * Math.sin((2 * Math.PI * 360 * i) / SR));
  let lp = 0;
  const jet = new Float32Array(n(1, 44100)).map(() => (lp = 0.9 * lp + 0.1 * (random() * 2 - 1)) * 1.5);
  const pop = new Float32Array(n(0.15)).map((_, i) => (random() * 2 - 1) * Math.exp(-i / 600) * 0.8);
  const chime = new Float32Array(n(1.2, 96000)).map((_, i) => 0.3 * Math.sin((2 * Math.PI * 1320 * i) / 96000) * Math.exp(-i / 40000));
  const wind = [0, 1].map(() => {
    let w = 0;
    return new Float32Array(n(2)).map(() => (w = 0.98 * w + 0.02 * (random() * 2 - 1)) * 2);
  });
  return [
    { channels: [rotor], rate: SR },
    { channels: [jet], rate: 44100 },
    { channels: [pop], rate: SR },
    { channels: [chime], rate: 96000 },
    { channels: wind, rate: SR },
  ];
}

/** Three tunings to swap between: the built-in, a dark slow-motion with the high tier, a light one on the draft tier. */
function tunings(): Tuning[] {
  const dark = JSON.parse(serializeTuning(defaultTuning));
  dark.resampler.tier = 'high';
  dark.doppler.factor = 2;
  dark.groups.effects.tone = { interpolation: 'monotone', keys: [{ x: 0, y: 400 }, { x: 0.5, y: 3000 }, { x: 1, y: 20000 }] };
  dark.master.gainDb = 6;
  const light = JSON.parse(serializeTuning(defaultTuning));
  light.resampler.tier = 'draft';
  light.doppler.velocityClock = 'game';
  light.master.ceilingDb = -3;
  return [defaultTuning, parseTuning(dark), parseTuning(light)];
}

/** Renders `seconds` of simulated gameplay and returns the figures (no exception escapes the engine's render). */
export function runSoak(options: SoakOptions): SoakFigures {
  const random = prng(options.seed ?? 0x50a4);
  const gc = options.gc ?? (() => {});
  const heap = options.heapUsed ?? (() => 0);
  const now = options.now;
  const all = tunings();
  let tuning = all[0];
  const engine = new Engine({ sampleRate: SR, capacity: 32, maxSources: 128, tuning });
  const bank = sounds(random);
  const ids = bank.map((s) => engine.addSound(s.channels, s.rate));
  const snapshot: EngineSnapshot = {
    time: 0,
    listener: { position: { x: 0, y: 2, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } },
    sources: [],
  };
  for (let i = 0; i < DRONES; i++) snapshot.sources.push({ id: i, position: { x: 0, y: 0, z: 0 } });
  snapshot.sources.push({ id: JET, position: { x: 0, y: 0, z: 0 } });
  const drone = { loop: true, group: 'vehicles', sourceId: 0, gain: 0.3, ratio: 1 };
  const oneShot = { group: 'effects', sourceId: 0, gain: 0.5, ratio: 1 };
  const loop = { loop: true, group: 'ambience', gain: 0.2 };
  const ramp = { target: 1, rampSeconds: 0.3, easing: 'smooth' as const };
  const droneVoices: number[] = [];
  for (let i = 0; i < DRONES; i++) {
    drone.sourceId = i;
    drone.ratio = 0.8 + 0.4 * random();
    droneVoices.push(engine.play(ids[0], drone));
  }
  let windVoice = engine.play(ids[4], loop);
  const jet = { loop: true, group: 'vehicles', sourceId: JET, gain: 0.6 };
  let jetVoice = -1;
  const l = new Float32Array(BLOCK);
  const r = new Float32Array(BLOCK);
  const totalBlocks = Math.ceil((options.seconds * SR) / BLOCK);
  const warmBlock = Math.min(totalBlocks - 1, Math.round((5 * SR) / BLOCK));
  const f: SoakFigures = {
    simulatedSeconds: 0, frames: 0, snapshots: 0, plays: DRONES + 1, timeScaleChanges: 0, tuningSwaps: 0, nonFinite: 0, overCeiling: 0,
    peak: 0, clamps: 0, steals: 0, refused: 0, errors: 0, heapStart: 0, heapEnd: 0, heapChange: 0, wallSeconds: 0, realTimeFactor: NaN,
  };
  let nextScale = 2;
  let nextSwap = 12;
  let jetStart = -100;
  let ceiling = Math.pow(10, tuning.master.ceilingDb / 20);
  const t0 = now?.() ?? 0;
  for (let b = 0; b < totalBlocks; b++) {
    if (b === warmBlock) {
      gc();
      f.heapStart = heap();
    }
    const t = engine.time;
    if (b % SNAPSHOT_BLOCKS === 0) {
      snapshot.time = t;
      const lis = snapshot.listener.position;
      lis.x = 20 * Math.sin(t * 0.05);
      lis.z = 20 * Math.cos(t * 0.037);
      for (let i = 0; i < DRONES; i++) {
        const p = snapshot.sources[i].position;
        const w = 0.3 + 0.07 * i; // rad/s; radius 15…70 m: up to ~60 m/s
        const rad = 15 + 5 * i;
        p.x = rad * Math.cos(w * t + i);
        p.y = 3 + Math.sin(t + i);
        p.z = rad * Math.sin(w * t + i);
      }
      // The jet: 400 m/s (supersonic) straight over the quarry, 40 m up.
      const jp = snapshot.sources[DRONES].position;
      jp.x = -2000 + 400 * (t - jetStart);
      jp.y = 40;
      jp.z = 10;
      engine.pushSnapshot(snapshot);
      f.snapshots++;
      // Gameplay events at 60 Hz.
      const u = random();
      if (u < 0.08) {
        oneShot.sourceId = Math.floor(random() * DRONES);
        oneShot.ratio = 0.7 + 0.6 * random();
        engine.play(ids[u < 0.05 ? 2 : 3], oneShot);
        f.plays++;
      } else if (u < 0.082) {
        // A drone crashes and a new one takes off (stop + restart of a loop).
        const k = Math.floor(random() * DRONES);
        engine.stop(droneVoices[k], 0.05);
        drone.sourceId = k;
        drone.ratio = 0.8 + 0.4 * random();
        droneVoices[k] = engine.play(ids[0], drone);
        f.plays++;
      } else if (u < 0.0825 && t - jetStart > 10) {
        jetStart = t;
        engine.stop(jetVoice, 0.5);
        jetVoice = engine.play(ids[1], jet);
        f.plays++;
      } else if (u < 0.083) {
        engine.stop(windVoice, 0.2);
        windVoice = engine.play(ids[4], loop);
        f.plays++;
      }
    }
    if (t >= nextScale) {
      const k = random();
      ramp.target = k < 0.1 ? 0 : k < 0.2 ? 2 : k < 0.6 ? 0.2 + 0.3 * random() : 1;
      ramp.rampSeconds = 0.05 + 0.6 * random();
      engine.setTimeScale(ramp);
      f.timeScaleChanges++;
      nextScale = t + 2 + 6 * random();
    }
    if (t >= nextSwap) {
      tuning = all[(all.indexOf(tuning) + 1) % all.length];
      engine.setTuning(tuning);
      ceiling = Math.pow(10, tuning.master.ceilingDb / 20);
      f.tuningSwaps++;
      nextSwap = t + 30 + 30 * random();
    }
    engine.render([l, r], BLOCK);
    for (let i = 0; i < BLOCK; i++) {
      const a = l[i];
      const c = r[i];
      if (!(a - a === 0) || !(c - c === 0)) f.nonFinite++;
      const aa = Math.abs(a);
      const cc = Math.abs(c);
      const m = aa > cc ? aa : cc;
      if (m > ceiling * (1 + 1e-6)) f.overCeiling++;
      if (m > f.peak) f.peak = m;
    }
    f.frames += BLOCK;
    if (options.progress && b % Math.round((60 * SR) / BLOCK) === 0) options.progress(b / totalBlocks);
  }
  const t1 = now?.() ?? 0;
  gc();
  f.heapEnd = heap();
  f.heapChange = f.heapStart > 0 ? (f.heapEnd - f.heapStart) / f.heapStart : 0;
  f.simulatedSeconds = f.frames / SR;
  f.clamps = engine.stats.clamps;
  f.steals = engine.stats.steals;
  f.refused = engine.stats.refused;
  f.errors = engine.stats.errors;
  if (now) {
    f.wallSeconds = (t1 - t0) / 1000;
    f.realTimeFactor = f.simulatedSeconds / f.wallSeconds;
  }
  return f;
}

/** The figures as printed lines. */
export function formatSoak(f: SoakFigures): string {
  const mib = (b: number) => (b / 1048576).toFixed(2);
  return [
    `simulated: ${f.simulatedSeconds.toFixed(1)} s (${f.frames} frames, ${f.snapshots} snapshots, ${f.plays} plays, ${f.timeScaleChanges} time-scale changes, ${f.tuningSwaps} tuning swaps)`,
    `heap: ${mib(f.heapStart)} MiB at start, ${mib(f.heapEnd)} MiB at end (${(100 * f.heapChange).toFixed(2)} %)`,
    `non-finite samples: ${f.nonFinite}; above ceiling: ${f.overCeiling}; peak ${f.peak.toFixed(4)}`,
    `clamps: ${f.clamps}; steals: ${f.steals}; refused: ${f.refused}; errors: ${f.errors}`,
    Number.isFinite(f.realTimeFactor) ? `wall: ${f.wallSeconds.toFixed(1)} s; real-time factor: ${f.realTimeFactor.toFixed(1)}× real time` : 'wall: not timed',
  ].join('\n');
}
