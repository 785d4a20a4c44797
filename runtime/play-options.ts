// Play options as the game gives them (gain in dB, loop points and offsets in seconds) and their validation into
// the engine's PlayOptions; every problem throws RalentiOptionError naming the option, before anything is sent.
import type { Cents, Decibels, PlayOptions, Seconds, Tuning } from '../src/index';
import { MAX_PITCH_VARIATION_CENTS, MAX_GAIN_VARIATION_DB, MIN_GAIN_VARIATION_DB } from '../src/engine/index';
import { RalentiOptionError, checkRange } from './runtime-error';
import type { RalentiSource } from './ralenti-source';

/** Options of Ralenti.play: gains in dB, times in seconds. */
export interface RalentiPlayOptions {
  /** Group from the tuning; an unknown name throws RalentiOptionError listing the tuning's groups. Default 'effects'. */
  group?: string;
  /** Loop the sound (the whole sound, or loopStartSeconds…loopEndSeconds). */
  loop?: boolean;
  /** Loop region start, s of source time (default 0). */
  loopStartSeconds?: Seconds;
  /** Loop region end, s of source time (default: the sound's end). */
  loopEndSeconds?: Seconds;
  /** Start offset, s of source time (0…duration). */
  offsetSeconds?: Seconds;
  /** Gain in dB, −120…24 (default 0). */
  gainDb?: Decibels;
  /** Base playback ratio before time scale and Doppler, (0, 4] (default 1). */
  ratio?: number;
  /** Stealing priority 0…255 (default: the group's). */
  priority?: number;
  /** Fade-in, s (0…60; default 3 ms). */
  fadeInSeconds?: Seconds;
  /** Per-play pitch variation: uniform in [low, high] cents (each −2400…2400), seeded (createRalenti's seed). */
  pitchRange?: readonly [Cents, Cents];
  /** Per-play gain variation: uniform in [low, high] dB (each −60…24), seeded. */
  gainRange?: readonly [Decibels, Decibels];
  /** Positioned source the voice follows (position, velocity, spatial settings); absent = non-positional. */
  source?: RalentiSource;
}

function checkPair(field: string, v: unknown, min: number, max: number): readonly [number, number] {
  if (!Array.isArray(v) || v.length !== 2) throw new RalentiOptionError(field, 'expected [low, high]');
  checkRange(`${field}[0]`, v[0], min, max);
  checkRange(`${field}[1]`, v[1], v[0] as number, max);
  return [v[0], v[1]];
}

/** Validates `o` for `sound` under `tuning`; returns the engine's PlayOptions (loop points in frames), or throws RalentiOptionError. */
export function checkPlayOptions(o: RalentiPlayOptions, sound: { duration: Seconds; frames: number; sampleRate: number }, tuning: Tuning): PlayOptions {
  const out: PlayOptions = {};
  if (o.group !== undefined) {
    if (typeof o.group !== 'string' || !Object.prototype.hasOwnProperty.call(tuning.groups, o.group))
      throw new RalentiOptionError('play.group', `unknown group "${String(o.group)}" (tuning has: ${Object.keys(tuning.groups).join(', ')})`);
    out.group = o.group;
  }
  if ('gain' in (o as object)) throw new RalentiOptionError('play.gain', 'gains are in dB at this API: use gainDb');
  if (o.loop !== undefined) out.loop = o.loop === true;
  if (o.gainDb !== undefined) out.gainDb = checkRange('play.gainDb', o.gainDb, -120, 24);
  if (o.ratio !== undefined) {
    checkRange('play.ratio', o.ratio, 0, 4);
    if (o.ratio <= 0) throw new RalentiOptionError('play.ratio', 'expected a ratio above 0');
    out.ratio = o.ratio;
  }
  if (o.offsetSeconds !== undefined) out.offsetSeconds = checkRange('play.offsetSeconds', o.offsetSeconds, 0, sound.duration);
  if (o.fadeInSeconds !== undefined) out.fadeInSeconds = checkRange('play.fadeInSeconds', o.fadeInSeconds, 0, 60);
  if (o.priority !== undefined) out.priority = checkRange('play.priority', o.priority, 0, 255);
  const rate = sound.sampleRate;
  if (o.loopStartSeconds !== undefined) out.loopStart = Math.round(checkRange('play.loopStartSeconds', o.loopStartSeconds, 0, (sound.frames - 1) / rate) * rate);
  if (o.loopEndSeconds !== undefined) {
    out.loopEnd = Math.round(checkRange('play.loopEndSeconds', o.loopEndSeconds, 0, sound.duration) * rate);
    if (out.loopEnd <= (out.loopStart ?? 0)) throw new RalentiOptionError('play.loopEndSeconds', 'loop end must be after loop start');
  }
  if (o.pitchRange !== undefined) out.pitchRange = checkPair('play.pitchRange', o.pitchRange, -MAX_PITCH_VARIATION_CENTS, MAX_PITCH_VARIATION_CENTS);
  if (o.gainRange !== undefined) out.gainRange = checkPair('play.gainRange', o.gainRange, MIN_GAIN_VARIATION_DB, MAX_GAIN_VARIATION_DB);
  return out;
}
