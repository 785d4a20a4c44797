// The check itself, without files or a command line: each tonal voice of a scene script is judged against the pitch
// expected from the script's motion and the tuning's declared values (runtime/check/expect), either on the audio the
// browser played (a recorded mix) or on an offline re-render of the script with the engine, one voice solo at a time.
import type { Tuning } from '../../src/tuning';
import { renderLoadedScene, type SceneRenderOptions, type SceneRenderResult } from '../offline/scene-renderer';
import type { SceneScript, SoundSpec } from '../offline/scene-types';
import type { SoundBuffer } from '../offline/scene-sounds';
import { ExpectedVoice, type DopplerModel } from './expect/expected-voice';
import { TimeScaleTrack } from './expect/time-scale-track';
import { checkLimitDefaults, judgeSource, type CheckLimits, type JudgedSource } from './judge/judge-source';

/** A scene as the check needs it (what loadScene / loadSceneFile return). */
export interface CheckableScene {
  script: SceneScript;
  sounds: Readonly<Record<string, SoundBuffer>>;
  tuning: Tuning;
}

/** Renders a script with the engine (renderLoadedScene's signature); tests pass engine variants here. */
export type SceneRenderer = (script: SceneScript, sounds: Readonly<Record<string, SoundBuffer>>, tuning: Tuning, options: SceneRenderOptions) => SceneRenderResult;

/** Options of checkScene and checkAudio. */
export interface CheckOptions {
  /** Pass/fail limits (defaults: checkLimitDefaults). */
  limits?: Partial<CheckLimits>;
  /** Render rate in Hz for the re-render (default: the script's). */
  sampleRate?: number;
  /** Tuning the engine renders with (default: the scene's). The expectation always uses the scene's tuning. */
  renderTuning?: Tuning;
  /** Renderer of the re-render (default: renderLoadedScene, the engine as shipped). */
  render?: SceneRenderer;
  /** Called with the fraction done, 0…1. */
  onProgress?: (fraction: number) => void;
}

/** One judged voice with what the report needs beside the figures. */
export interface CheckedSource extends JudgedSource {
  /** Index of the voice in the script. */
  voice: number;
  /** Doppler model of the expectation. */
  model: DopplerModel;
}

/** Result of a check. */
export interface CheckResult {
  /** What was judged: the audio the browser played, or an offline re-render of the script. */
  mode: 'recorded-audio' | 're-render';
  /** One entry per voice of a tone or hum sound, in script order. */
  sources: CheckedSource[];
  /** Voices of noise or WAV sounds, which have no known pitch and are not judged. */
  skipped: number;
  /** The script's time scale at the frame times (for the report's strip). */
  timeScale: { times: Float64Array; values: Float64Array };
  /** The limits used. */
  limits: CheckLimits;
  /** True when there was at least one tonal voice and every one passed. */
  passed: boolean;
}

/** Relative harmonic amplitudes of a tone or hum sound spec; null for noise and WAV sounds (no known pitch). */
export function partialsOf(spec: SoundSpec | undefined): readonly number[] | null {
  if (!spec || spec.type === 'noise' || spec.type === 'file') return null;
  return spec.type === 'tone' ? [1] : spec.partials;
}

interface Tonal {
  index: number;
  name: string;
  expected: ExpectedVoice;
  partials: readonly number[];
}

function tonalVoices(scene: CheckableScene): Tonal[] {
  const { script, sounds, tuning } = scene;
  const out: Tonal[] = [];
  script.voices.forEach((v, index) => {
    const partials = partialsOf(script.sounds[v.sound]);
    const f = sounds[v.sound]?.frequency;
    if (partials === null || !(f != null && f > 0)) return;
    const name = `voice ${index} (${v.sound}${v.source ? ` on ${v.source}` : ''})`;
    const buf = sounds[v.sound];
    const seconds = buf && buf.channels.length > 0 ? buf.channels[0].length / buf.sampleRate : null;
    out.push({ index, name, expected: new ExpectedVoice(script, v, tuning, f, seconds), partials });
  });
  return out;
}

/** The gain of a voice's sound spec (tones and hums), 1 otherwise. */
function soundGain(scene: CheckableScene, voice: number): number {
  const spec = scene.script.sounds[scene.script.voices[voice].sound];
  return spec && 'gain' in spec ? spec.gain : 1;
}

function expectedHz(e: ExpectedVoice): (t: number) => number {
  return (t) => e.at(t).hz;
}

function finish(scene: CheckableScene, mode: CheckResult['mode'], sources: CheckedSource[], limits: CheckLimits): CheckResult {
  const track = new TimeScaleTrack(scene.script.timeScale, scene.script.duration);
  const times = sources.length > 0 ? Float64Array.from(sources[0].times) : new Float64Array(0);
  return {
    mode,
    sources,
    skipped: scene.script.voices.length - sources.length,
    timeScale: { times, values: Float64Array.from(times, (t) => track.valueAt(t)) },
    limits,
    passed: sources.length > 0 && sources.every((s) => s.passed),
  };
}

function mono(channels: readonly Float32Array[]): Float32Array {
  const out = new Float32Array(channels[0]?.length ?? 0);
  for (const c of channels) for (let i = 0; i < out.length; i++) out[i] += c[i] / channels.length;
  return out;
}

/** Re-renders each tonal voice solo with the engine and judges it (mode 're-render'). */
export function checkScene(scene: CheckableScene, options: CheckOptions = {}): CheckResult {
  const limits = { ...checkLimitDefaults, ...options.limits };
  const sr = options.sampleRate ?? scene.script.sampleRate;
  const render = options.render ?? renderLoadedScene;
  const tonal = tonalVoices(scene);
  const sources: CheckedSource[] = tonal.map((v, k) => {
    const progress = options.onProgress;
    const rendered = render(scene.script, scene.sounds, options.renderTuning ?? scene.tuning, {
      sampleRate: sr,
      voiceFilter: (_s, j) => j === v.index,
      onProgress: progress ? (f) => progress((k + f) / tonal.length) : undefined,
    });
    const judged = judgeSource({
      name: v.name,
      audio: mono([rendered.left, rendered.right]),
      sampleRate: sr,
      expectedHz: expectedHz(v.expected),
      partials: v.partials,
      others: [],
      jumps: v.expected.jumpWindows(1 / 60),
      closestApproach: v.expected.closestApproach(scene.script.duration)?.time ?? null,
      limits,
    });
    return { ...judged, voice: v.index, model: v.expected.model };
  });
  return finish(scene, 're-render', sources, limits);
}

/**
 * Judges recorded audio (the mix the browser played, time 0 = the script's time 0) against the script (mode
 * 'recorded-audio'): each tonal voice through a band that follows its expected pitch; frames where another voice's
 * harmonic can disturb that band (judge-source.ts) are left unjudged as overlap.
 */
export function checkAudio(scene: CheckableScene, audio: { sampleRate: number; channels: readonly Float32Array[] }, options: CheckOptions = {}): CheckResult {
  const limits = { ...checkLimitDefaults, ...options.limits };
  const tonal = tonalVoices(scene);
  const mix = mono(audio.channels);
  const sources: CheckedSource[] = tonal.map((v, k) => {
    options.onProgress?.(k / tonal.length);
    const others = tonal.filter((o) => o !== v).map((o) => ({ expectedHz: expectedHz(o.expected), partials: o.partials, levelAt: (t: number) => o.expected.gainAt(t) * soundGain(scene, o.index) }));
    const judged = judgeSource({
      name: v.name,
      audio: mix,
      sampleRate: audio.sampleRate,
      expectedHz: expectedHz(v.expected),
      partials: v.partials,
      levelAt: (t: number) => v.expected.gainAt(t) * soundGain(scene, v.index),
      others,
      jumps: v.expected.jumpWindows(1 / 60),
      closestApproach: v.expected.closestApproach(scene.script.duration)?.time ?? null,
      limits,
    });
    return { ...judged, voice: v.index, model: v.expected.model };
  });
  options.onProgress?.(1);
  return finish(scene, 'recorded-audio', sources, limits);
}
