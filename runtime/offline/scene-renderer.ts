// Drives the engine through a scene script block by block, as a game would: snapshots at the script's
// rate (60 Hz by default), time-scale ramps, and voices started and stopped at render-quantum boundaries.
import { Engine } from '../../src/engine';
import type { EngineStats, QualityTierName, Tuning, Vec3Like } from '../../src/index';
import type { SceneScript, VoiceSpec } from './scene-types';
import type { SoundBuffer } from './scene-sounds';
import { evaluateMotion } from './scene-motion';

/** Render quantum of the offline renderer (frames), the Web Audio API's default. */
export const SCENE_BLOCK_FRAMES = 128;

/** Options of renderLoadedScene / renderScene. */
export interface SceneRenderOptions {
  /** Output sample rate in Hz (default: the script's sampleRate). */
  sampleRate?: number;
  /** Resampler tier, overriding the tuning's. */
  tier?: QualityTierName;
  /** Called with the fraction done (0…1), at most about 100 times per render. */
  onProgress?: (fraction: number) => void;
  /** Renders only the voices this returns true for (e.g. one source solo, for checking). */
  voiceFilter?: (voice: VoiceSpec, index: number) => boolean;
}

/** Summary of a render. */
export interface SceneRenderStats {
  /** Voices started, and voices the engine refused. */
  voicesStarted: number;
  voicesRefused: number;
  /** Largest voice count heard at once (active + virtual). */
  maxVoices: number;
  /** Peak |sample| of the output, and of the mix before the limiter. */
  peak: number;
  peakBeforeLimiter: number;
  /** Deepest limiter gain reduction seen, dB (≤ 0). */
  limiterDb: number;
  /** Engine counters at the end (clamps, steals, refused, errors …). */
  engine: EngineStats;
}

/** Result of a render: stereo output at `sampleRate`. */
export interface SceneRenderResult {
  left: Float32Array;
  right: Float32Array;
  sampleRate: number;
  stats: SceneRenderStats;
}

/** Source ids the renderer gives the script's sources: 1, 2, … in the order of `script.sources`. */
export function sceneSourceIds(script: SceneScript): Map<string, number> {
  return new Map(Object.keys(script.sources).map((name, i) => [name, i + 1]));
}

/** Renders a parsed script with its sounds already decoded or generated (no file access). */
export function renderLoadedScene(script: SceneScript, sounds: Readonly<Record<string, SoundBuffer>>, tuning: Tuning, options: SceneRenderOptions = {}): SceneRenderResult {
  const run = new SceneRun(script, sounds, tuning, options);
  const left = new Float32Array(run.totalFrames);
  const right = new Float32Array(run.totalFrames);
  for (let o = 0, n = run.step(); n > 0; o += n, n = run.step()) {
    left.set(n === SCENE_BLOCK_FRAMES ? run.left : run.left.subarray(0, n), o);
    right.set(n === SCENE_BLOCK_FRAMES ? run.right : run.right.subarray(0, n), o);
  }
  return { left, right, sampleRate: run.sampleRate, stats: run.stats };
}

/**
 * One render of a scene script, a block at a time: `step()` renders the next block into `left`/`right` and returns
 * its frame count (0 when done), so a caller can stream the output to disk with bounded memory.
 */
export class SceneRun {
  /** Output sample rate, Hz. */
  readonly sampleRate: number;
  /** Frames of the whole render. */
  readonly totalFrames: number;
  /** Left channel of the last block (its first `step()` frames are valid). */
  readonly left = new Float32Array(SCENE_BLOCK_FRAMES);
  /** Right channel of the last block. */
  readonly right = new Float32Array(SCENE_BLOCK_FRAMES);
  /** Summary so far. */
  readonly stats: SceneRenderStats;
  /** Frames rendered so far. */
  rendered = 0;
  private readonly engine: Engine;
  private readonly step0: () => number;

  /** Builds the engine, adds the sounds and pushes the first snapshot. */
  constructor(script: SceneScript, sounds: Readonly<Record<string, SoundBuffer>>, tuning: Tuning, options: SceneRenderOptions = {}) {
    const sr = options.sampleRate ?? script.sampleRate;
    this.sampleRate = sr;
    const t = options.tier && options.tier !== tuning.resampler.tier ? { ...tuning, resampler: { tier: options.tier } } : tuning;
    const voices = script.voices.map((v, i) => ({ spec: v, index: i })).filter(({ spec, index }) => options.voiceFilter?.(spec, index) ?? true);
    const sourceNames = Object.keys(script.sources);
    const engine = new Engine({ sampleRate: sr, capacity: Math.min(1024, Math.max(64, voices.length)), maxSources: Math.max(16, sourceNames.length), tuning: t, seed: script.seed });
    this.engine = engine;
    const soundIds = new Map<string, number>();
    for (const [name, buf] of Object.entries(sounds)) soundIds.set(name, engine.addSound(buf.channels, buf.sampleRate));
    const ids = sceneSourceIds(script);
    const total = Math.round(script.duration * sr);
    this.totalFrames = total;
    const blockL = this.left;
    const blockR = this.right;
    const snapEvery = Math.max(1, Math.round(sr / SCENE_BLOCK_FRAMES / script.snapshotRate));
    const exact = script.velocities === 'exact';

    const listenerPos: Vec3Like = { x: 0, y: 0, z: 0 };
    const listenerVel: Vec3Like = { x: 0, y: 0, z: 0 };
    const [fx, fy, fz] = script.listener.forward;
    const [ux, uy, uz] = script.listener.up;
    const snapshot = (time: number) => {
      evaluateMotion(script.listener.motion, time, listenerPos, listenerVel);
      return {
        time,
        listener: { position: { ...listenerPos }, forward: { x: fx, y: fy, z: fz }, up: { x: ux, y: uy, z: uz }, velocity: exact ? { ...listenerVel } : undefined },
        sources: sourceNames.map((name) => {
          const p = { x: 0, y: 0, z: 0 };
          const v = { x: 0, y: 0, z: 0 };
          evaluateMotion(script.sources[name].motion, time, p, v);
          return { id: ids.get(name)!, position: p, velocity: exact ? v : undefined };
        }),
      };
    };

    const handles = new Array<number>(voices.length).fill(-1);
    const started = new Array<boolean>(voices.length).fill(false);
    const stopped = new Array<boolean>(voices.length).fill(false);
    let nextKey = 0;
    const stats: SceneRenderStats = { voicesStarted: 0, voicesRefused: 0, maxVoices: 0, peak: 0, peakBeforeLimiter: 0, limiterDb: 0, engine: engine.stats };
    this.stats = stats;
    let lastProgress = -1;
    engine.pushSnapshot(snapshot(0));
    let block = 0;
    this.step0 = () => {
      const o = this.rendered;
      if (o >= total) {
        engine.dispose(); // the render is complete: its module memory goes back at once
        return 0;
      }
      const n = Math.min(SCENE_BLOCK_FRAMES, total - o);
      const t0 = o / sr;
      const t1 = (o + n) / sr;
      if (block % snapEvery === 0) {
        // One snapshot interval ahead: the engine glides to it over the interval, following the path exactly.
        engine.pushSnapshot(snapshot(t0 + (snapEvery * SCENE_BLOCK_FRAMES) / sr));
      }
      block++;
      while (nextKey < script.timeScale.length && script.timeScale[nextKey].time < t1) {
        const k = script.timeScale[nextKey++];
        engine.setTimeScale({ target: k.target, rampSeconds: k.rampSeconds, easing: k.easing, startTime: k.time });
      }
      for (let i = 0; i < voices.length; i++) {
        const v = voices[i].spec;
        if (!started[i] && v.start < t1) {
          started[i] = true;
          handles[i] = startVoice(engine, v, soundIds.get(v.sound)!, sounds[v.sound], v.source === null ? undefined : ids.get(v.source));
          if (handles[i] >= 0) stats.voicesStarted++;
          else stats.voicesRefused++;
        }
        if (started[i] && !stopped[i] && v.stop !== null && v.stop < t1) {
          stopped[i] = true;
          engine.stop(handles[i], v.fadeOutSeconds);
        }
      }
      engine.render([blockL, blockR], n);
      const st = engine.stats;
      stats.maxVoices = Math.max(stats.maxVoices, st.activeVoices + st.virtualVoices);
      stats.peak = Math.max(stats.peak, st.peakOut);
      stats.peakBeforeLimiter = Math.max(stats.peakBeforeLimiter, st.peakIn);
      stats.limiterDb = Math.min(stats.limiterDb, st.limiterDb);
      this.rendered = o + n;
      const p = Math.floor(((o + n) / total) * 100);
      if (options.onProgress && p !== lastProgress) {
        lastProgress = p;
        options.onProgress((o + n) / total);
      }
      return n;
    };
  }

  /** Renders the next block into `left`/`right`; returns its frame count, 0 when the render is complete (the engine is then disposed). */
  step(): number {
    return this.step0();
  }

  /** Ends the render early (the engine's memory is released; later steps return 0); idempotent, implied by the last step. */
  dispose(): void {
    this.rendered = this.totalFrames;
    this.engine.dispose();
  }
}

function startVoice(engine: Engine, v: VoiceSpec, sound: number, buf: SoundBuffer, sourceId: number | undefined): number {
  const rate = buf.sampleRate;
  return engine.play(sound, {
    group: v.group ?? undefined,
    loop: v.loop,
    loopStart: v.loopStartSeconds === null ? undefined : Math.round(v.loopStartSeconds * rate),
    loopEnd: v.loopEndSeconds === null ? undefined : Math.round(v.loopEndSeconds * rate),
    offsetSeconds: v.offsetSeconds,
    gain: v.gain,
    ratio: v.ratio,
    priority: v.priority ?? undefined,
    sourceId,
    pitchRange: v.pitchRange ?? undefined,
    gainRange: v.gainRange ?? undefined,
  });
}
