// Scene-script equivalents of the sample scene's voices, for recorded fly-throughs: harmonic hums with the same
// fundamentals and similar partials as the procedural sounds (the script format holds tones, hums and noise only).
import type { RecordedVoice } from '../runtime/recording';

/** The positional voices of the scene: sound and source name, tuning group and voice gain (used by scene-audio too). */
export const SCENE_VOICES = Object.freeze({
  drone: Object.freeze({ group: 'vehicles', gain: 1.6 }),
  kart: Object.freeze({ group: 'vehicles', gain: 1.4 }),
  orb: Object.freeze({ group: 'effects', gain: 0.35 }),
  generator: Object.freeze({ group: 'ambience', gain: 0.9 }),
});

/** Name of a positional voice (and of its source) in the scene and in recorded scripts. */
export type SceneVoiceName = keyof typeof SCENE_VOICES;

const range = (n: number, f: (h: number) => number) => Array.from({ length: n }, (_, i) => Math.round(f(i + 1) * 1e4) / 1e4);

/**
 * Hum specs (scene-script `sounds`) by voice name: drone 150 Hz, 14 partials at 1/h^0.9 (its blade flutter left out);
 * kart 70 Hz, 24 partials, odd 1/h and even 0.55/h (its 1.5× second voice and saturation left out, which would move
 * the fundamental to 35 Hz); orb 330 Hz, odd partials 1/h to the 15th (its 11 Hz tremolo left out); generator 100 Hz
 * with partials 1, 0.5, 0.3, 0, 0.15 (its hiss left out). Peak level about 0.5, as the procedural sounds.
 */
export const SCRIPT_SOUNDS: Readonly<Record<SceneVoiceName, Readonly<Record<string, unknown>>>> = Object.freeze({
  drone: { type: 'hum', frequency: 150, partials: range(14, (h) => 1 / h ** 0.9), seconds: 2, gain: 0.5 },
  kart: { type: 'hum', frequency: 70, partials: range(24, (h) => (h % 2 === 1 ? 1 : 0.55) / h), seconds: 2, gain: 0.5 },
  orb: { type: 'hum', frequency: 330, partials: range(15, (h) => (h % 2 === 1 ? 1 / h : 0)), seconds: 2, gain: 0.5 },
  generator: { type: 'hum', frequency: 100, partials: [1, 0.5, 0.3, 0, 0.15], seconds: 2, gain: 0.5 },
});

/** The voices a recorded script plays: one looped hum per positional source (music and clicks have no equivalent). */
export const SCRIPT_VOICES: readonly RecordedVoice[] = Object.freeze(
  (Object.keys(SCENE_VOICES) as SceneVoiceName[]).map((name) => Object.freeze({ sound: name, source: name, group: SCENE_VOICES[name].group, gain: SCENE_VOICES[name].gain })),
);
