// The check itself, without files or a command line: renders each tonal voice of a loaded scene solo with the engine,
// tracks its pitch (YIN, src/analysis) and compares it with the heard frequency expected from motion and tuning alone.
import type { Tuning } from '../../src/index';
import { pitchErrorStats, trackPitch } from '../../src/analysis';
import { TimeFlow } from '../../src/dilation';
import { ratioToCents } from '../../src/dsp';
import { renderLoadedScene, SCENE_BLOCK_FRAMES } from '../offline/scene-renderer';
import { evaluateMotion } from '../offline/scene-motion';
import type { MotionSpec, SceneScript } from '../offline/scene-types';
import type { SoundBuffer } from '../offline/scene-sounds';
import { ExpectedPitch, type MotionAt } from './expected-pitch';
import type { ReportSource } from './report-svg';

/** Frames at the edges of a voice's life that are not judged (the fades and the tracker's window), s. */
export const CHECK_EDGE_SECONDS = 0.06;
/** Analysis window of the pitch tracker, s. */
export const CHECK_WINDOW_SECONDS = 0.03;

/** A scene as the check needs it (what loadScene / loadSceneFile return). */
export interface CheckableScene {
  script: SceneScript;
  sounds: Readonly<Record<string, SoundBuffer>>;
  tuning: Tuning;
}

/** Options of checkScene. */
export interface CheckSceneOptions {
  /** Pass/fail tolerance in cents, 0.1…1200 (default 5). */
  toleranceCents?: number;
  /** Render rate in Hz (default: the script's). */
  sampleRate?: number;
  /** Tuning the engine renders with (default: the scene's). The expectation always uses the scene's tuning. */
  renderTuning?: Tuning;
  /** Called with the fraction done, 0…1. */
  onProgress?: (fraction: number) => void;
}

/** Result of checkScene. */
export interface CheckSceneResult {
  /** One entry per voice of a tone or hum sound, in script order. */
  sources: ReportSource[];
  /** Voices of noise or WAV sounds, which have no known pitch and are not checked. */
  skipped: number;
  /** The script's time scale at the tracker's frame times (for the report's strip). */
  timeScale: { times: Float64Array; values: Float64Array };
  /** True when there was at least one tonal voice and every one passed. */
  passed: boolean;
}

function motionAt(spec: MotionSpec): MotionAt {
  return (time, out) => evaluateMotion(spec, time, out.position, out.velocity);
}

/** Time-scale curve of a script, as the renderer applies it: each key's ramp from its start time on. */
export function scriptTimeScale(script: SceneScript): (time: number) => number {
  const keys = script.timeScale;
  const flows: TimeFlow[] = [];
  for (let k = 0; k < keys.length; k++) {
    const flow = new TimeFlow();
    for (let j = 0; j <= k; j++) flow.set({ target: keys[j].target, rampSeconds: keys[j].rampSeconds, easing: keys[j].easing, startTime: keys[j].time }, keys[j].time);
    flows.push(flow);
  }
  return (t) => {
    let k = -1;
    while (k + 1 < keys.length && keys[k + 1].time <= t) k++;
    return k < 0 ? 1 : flows[k].valueAt(t);
  };
}

/**
 * Checks every tonal voice of `scene`. Frames are judged inside the voice's life, inside the tracker's range, and where
 * the expected pitch moves less than the tolerance across one analysis window (the tracker reports a window average);
 * a voice passes when the 95th percentile of its error there is within the tolerance.
 */
export function checkScene(scene: CheckableScene, options: CheckSceneOptions = {}): CheckSceneResult {
  const { script, sounds, tuning } = scene;
  const tolerance = options.toleranceCents ?? 5;
  const sr = options.sampleRate ?? script.sampleRate;
  const tonal = script.voices.map((v, i) => ({ v, i })).filter(({ v }) => sounds[v.sound]?.frequency != null);
  const timeScaleAt = scriptTimeScale(script);
  const listener = motionAt(script.listener.motion);
  const results: ReportSource[] = [];
  for (let k = 0; k < tonal.length; k++) {
    const { v, i } = tonal[k];
    const progress = options.onProgress;
    const rendered = renderLoadedScene(script, sounds, options.renderTuning ?? tuning, {
      sampleRate: sr,
      voiceFilter: (_s, j) => j === i,
      onProgress: progress ? (f) => progress((k + f) / tonal.length) : undefined,
    });
    const mono = new Float32Array(rendered.left.length);
    for (let n = 0; n < mono.length; n++) mono[n] = 0.5 * (rendered.left[n] + rendered.right[n]);
    const emitted = sounds[v.sound].frequency! * v.ratio;
    const minHz = Math.max(20, emitted / 5);
    const maxHz = Math.min(sr / 4, emitted * 5);
    const track = trackPitch(mono, sr, { hopSeconds: 0.01, minHz, maxHz, windowSeconds: CHECK_WINDOW_SECONDS });
    const start = (Math.floor((v.start * sr) / SCENE_BLOCK_FRAMES) * SCENE_BLOCK_FRAMES) / sr;
    const source = v.source === null ? null : motionAt(script.sources[v.source].motion);
    const expect = (times: ArrayLike<number>) =>
      new ExpectedPitch({ emittedHz: emitted, group: v.group ?? undefined, tuning, source, listener, timeScaleAt, startTime: start }).frequencies(times);
    const expected = expect(track.times);
    const half = CHECK_WINDOW_SECONDS / 2;
    const lo = expect(Float64Array.from(track.times, (t) => t - half));
    const hi = expect(Float64Array.from(track.times, (t) => t + half));
    const end = v.stop ?? script.duration;
    const judged = new Float64Array(track.times.length);
    for (let n = 0; n < judged.length; n++) {
      const t = track.times[n];
      const e = expected[n];
      const steady = Math.abs(ratioToCents(hi[n] / lo[n])) <= tolerance;
      const inRange = e >= minHz * 1.1 && e <= maxHz / 1.1;
      judged[n] = t < start + CHECK_EDGE_SECONDS || t > end - CHECK_EDGE_SECONDS || !steady || !inRange ? NaN : e;
    }
    const stats = pitchErrorStats(judged, track.frequencies);
    const passed = stats.count > 0 && stats.p95Cents <= tolerance;
    const name = `voice ${i} (${v.sound}${v.source ? ` on ${v.source}` : ''})`;
    results.push({ name, times: track.times, expectedHz: expected, judgedHz: judged, measuredHz: track.frequencies, stats, passed, note: stats.count === 0 ? 'no pitch found where one was expected' : undefined });
  }
  const times = results.length > 0 ? Float64Array.from(results[0].times) : new Float64Array(0);
  return {
    sources: results,
    skipped: script.voices.length - tonal.length,
    timeScale: { times, values: Float64Array.from(times, (t) => timeScaleAt(t)) },
    passed: results.length > 0 && results.every((r) => r.passed),
  };
}
