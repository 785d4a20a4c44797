// Judges one source's heard pitch against its expectation, frame by frame, by analysis through synthesis: a clean
// signal that follows the expected frequency exactly is tracked with the same YIN tracker (docs/references.md §7) and
// the same windows as the heard audio, so the tracker's averaging over fast glides (closest approach) cancels and
// every voiced frame can be judged. Frames that cannot be judged are kept as spans with their reason.
import { PitchTracker } from '../../../src/analysis';
import { centsToRatio, dbToGain, gainToDb, ratioToCents } from '../../../src/dsp';
import { followBand } from './band-follower';
import { verdict } from './source-verdict';

/** Why a frame of a sounding source was not judged. */
export type UnjudgedReason = 'unvoiced' | 'level' | 'overlap' | 'range' | 'path-step';

/** A run of frames with one reason, in seconds of the audio. */
export interface UnjudgedSpan {
  from: number;
  to: number;
  reason: UnjudgedReason;
}

/** Pass/fail limits of the check. */
export interface CheckLimits {
  /** Largest 95th percentile of the error, cents (default 5: about the smallest audible shift, docs/references.md §10). */
  p95Cents: number;
  /** Largest single-frame error, cents (default 20). */
  maxCents: number;
  /** Smallest judged share of sounding frames within ±closestApproachSeconds of closest approach, 0…1 (default 0.9). */
  closestApproachShare: number;
  /** Half-width of the closest-approach window, s (default 0.5). */
  closestApproachSeconds: number;
  /** Smallest judged share of all sounding frames, 0…1 (default 0.5). */
  judgedShare: number;
}

/** Frozen default limits. */
export const checkLimitDefaults: Readonly<CheckLimits> = Object.freeze({ p95Cents: 5, maxCents: 20, closestApproachShare: 0.9, closestApproachSeconds: 0.5, judgedShare: 0.5 });

/** What judgeSource needs. */
export interface JudgeInput {
  /** Source name for messages. */
  name: string;
  /** Heard audio, mono. */
  audio: Float32Array;
  sampleRate: number;
  /** Expected fundamental at audio time t (s), NaN while the source is not heard. */
  expectedHz: (t: number) => number;
  /** Relative amplitudes of the source's harmonics (a tone: [1]). */
  partials: readonly number[];
  /** Amplitude of this source's fundamental at the listener at time t (linear; only compared with the others'). */
  levelAt?: (t: number) => number;
  /** Other sources in the same audio (a mix): expected fundamentals, partial amplitudes and levels; empty for a stem. */
  others: readonly { expectedHz: (t: number) => number; partials: readonly number[]; levelAt?: (t: number) => number }[];
  /** Windows (s) not to judge because the path jumps there (listed as 'path-step'). */
  jumps?: readonly { from: number; to: number }[];
  /** Reception time of closest approach, s, or null for a source without one. */
  closestApproach: number | null;
  limits: CheckLimits;
  /** Hop between frames, s (default 0.01). */
  hopSeconds?: number;
  /** Tracker window, s (default 0.03). */
  windowSeconds?: number;
}

/** Error figures of one source. */
export interface SourceFigures {
  medianCents: number;
  p95Cents: number;
  maxCents: number;
  /** Audio time of the largest error, s (NaN when nothing was judged). */
  maxAt: number;
  /** Frames while the source sounds, and how many of them were judged. */
  soundingFrames: number;
  judgedFrames: number;
  /** judgedFrames / soundingFrames (0 when nothing sounds). */
  judgedShare: number;
  /** Judged share within the closest-approach window (NaN without one). */
  closestApproachShare: number;
}

/** Per-frame result of one source. */
export interface JudgedSource {
  name: string;
  /** Frame times (s). */
  times: Float64Array;
  /** Instantaneous expected frequency at each frame, Hz (NaN when not heard). */
  expectedHz: Float64Array;
  /** Heard frequency (tracked), Hz (NaN when none). */
  heardHz: Float64Array;
  /** Signed error in cents on judged frames, NaN elsewhere. */
  errorCents: Float64Array;
  unjudged: UnjudgedSpan[];
  figures: SourceFigures;
  closestApproach: number | null;
  passed: boolean;
  /** Why it failed, each naming the source and a time; empty when it passed. */
  failures: string[];
}

/** Beyond this distance from a fundamental, another voice's harmonic never counts as overlap, cents. */
const OVERLAP_CENTS = 700;
/** Within this distance it always does, cents. */
const OVERLAP_NEAR_CENTS = 120;
/** Between the two: overlap when it is less than this far below the fundamental after the band filter, dB. */
const OVERLAP_DB = 30;
/** Quality of the band follower's sections (band-follower.ts default). */
const BAND_Q = 6;
/** Smallest jump of the expected pitch within 1 ms, beyond its neighbours' change, that counts as a step (or the p95 limit if larger), cents. */
const STEP_CENTS = 2;
/** Frames this close to a step are not judged: one frame interval of a 60 Hz game, s. */
const STEP_GUARD_SECONDS = 1 / 60;
/** A source counts as sounding this long after its sound first arrives (a voice's fade-in and first block), s. */
const ONSET_SECONDS = 0.01;
/**
 * A frame whose window holds fewer than this many periods of the expected pitch while that pitch glides by more than
 * GLIDE_CENTS across the window is outside what the tracker measures: YIN's difference function compares the window
 * with itself one period later (docs/references.md §7), so under two periods of a steep low glide it measures the glide,
 * not the pitch (the figures are from memory / common practice; measured: a 100 Hz hum gliding to 43 Hz reads up to
 * 37 cents off where a 400 Hz or 800 Hz tone on the same path reads within 11 or 3 cents).
 */
const MIN_PERIODS_IN_WINDOW = 2;
/** Glide across one window above which a frame of too few periods is not judged, cents. */
const GLIDE_CENTS = 10;
const cents = (a: number, b: number): number => ratioToCents(a / b);

/** Judges one source; see the file comment. */
export function judgeSource(input: JudgeInput): JudgedSource {
  const sr = input.sampleRate;
  const n = input.audio.length;
  const hop = input.hopSeconds ?? 0.01;
  const win = input.windowSeconds ?? 0.03;
  // Expected frequency on a 1 ms grid, then per sample by straight lines; the synthetic reference integrates it.
  const grid = 0.001;
  const g = new Float64Array(Math.ceil(n / sr / grid) + 2);
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < g.length; i++) {
    const f = input.expectedHz(i * grid);
    g[i] = f;
    if (f > 0) [lo, hi] = [Math.min(lo, f), Math.max(hi, f)];
  }
  const expAt = (t: number): number => {
    const x = t / grid;
    const i = Math.floor(x);
    if (i < 0 || i + 1 >= g.length) return NaN;
    return g[i] + (x - i) * (g[i + 1] - g[i]);
  };
  // Steps of the expected pitch itself (a recorded path's velocity changing at a key, or a jump): more than
  // STEP_CENTS within one grid interval beyond what its neighbours change. No renderer that is fed the path at a
  // game's frame rate can follow such a step within a frame interval, so frames near one are listed, not judged.
  const stepCount = new Int32Array(g.length + 1);
  const stepCents = Math.max(STEP_CENTS, input.limits.p95Cents);
  for (let i = 0; i < g.length; i++) {
    let step = 0;
    if (i >= 2 && i + 2 < g.length && g[i - 2] > 0 && g[i + 2] > 0 && g[i] > 0 && g[i + 1] > 0 && g[i - 1] > 0) {
      const d = cents(g[i + 1], g[i]);
      const around = 0.5 * (cents(g[i], g[i - 1]) + cents(g[i + 2], g[i + 1]));
      step = Math.abs(d - around) > stepCents ? 1 : 0;
    }
    stepCount[i + 1] = stepCount[i] + step;
  }
  const stepsIn = (t0: number, t1: number): boolean => {
    const a = Math.max(0, Math.floor(t0 / grid));
    const b = Math.min(g.length, Math.ceil(t1 / grid));
    return b > a && stepCount[b] - stepCount[a] > 0;
  };
  const reference = new Float32Array(n);
  const amp = input.partials.reduce((a, b) => a + b, 0) || 1;
  let phase = 0;
  for (let i = 0; i < n; i++) {
    const f = expAt(i / sr);
    if (!(f > 0)) continue;
    phase += f / sr;
    phase -= Math.floor(phase);
    let v = 0;
    for (let k = 0; k < input.partials.length; k++) if ((k + 1) * f < sr / 2) v += input.partials[k] * Math.sin(2 * Math.PI * (k + 1) * phase);
    reference[i] = (0.5 * v) / amp;
  }
  const heard = Float32Array.from(input.audio);
  if (input.others.length > 0) {
    followBand(heard, sr, (i) => expAt(i / sr));
    followBand(reference, sr, (i) => expAt(i / sr));
  }
  const minHz = Math.max(30, (Number.isFinite(lo) ? lo : 100) / 1.5);
  const maxHz = Math.min(sr / 4 - 1, (Number.isFinite(hi) ? hi : 1000) * 1.5);
  const tracker = new PitchTracker({ sampleRate: sr, hopSeconds: hop, windowSeconds: win, minHz, maxHz });
  const heardTrack = tracker.track(heard);
  const refTrack = tracker.track(reference);
  const frames = heardTrack.times.length;
  const W = Math.round(win * sr);
  const span = tracker.frameFrames;
  const times = new Float64Array(frames);
  const expected = new Float64Array(frames);
  const errors = new Float64Array(frames).fill(NaN);
  const reasons: (UnjudgedReason | 'judged' | 'silent')[] = [];
  const levels = new Float64Array(frames);
  let peak = 0;
  for (let i = 0; i < frames; i++) {
    const o = i * tracker.hopFrames;
    let e = 0;
    for (let j = o; j < o + W; j++) e += heard[j] * heard[j];
    levels[i] = Math.sqrt(e / W);
    peak = Math.max(peak, levels[i]);
  }
  const floor = Math.max(1e-4, peak * dbToGain(-45));
  for (let i = 0; i < frames; i++) {
    const o = i * tracker.hopFrames;
    const t = (o + (W - 1) / 2) / sr;
    times[i] = t;
    const f = expAt(t);
    expected[i] = f;
    // The whole span the frame reads must be heard (no start, stop or silence inside it).
    let sounding = true;
    for (let j = o; j <= o + span && sounding; j += Math.max(1, Math.floor(sr * grid))) if (!(expAt(j / sr) > 0)) sounding = false;
    if (!sounding || !(expAt((o + span) / sr) > 0) || !(expAt(o / sr - ONSET_SECONDS) > 0)) {
      reasons.push('silent');
      continue;
    }
    let why: UnjudgedReason | 'judged' = 'judged';
    const fa = expAt(o / sr);
    const fb = expAt((o + span) / sr);
    const steepLow = Math.min(f, fa, fb) * win < MIN_PERIODS_IN_WINDOW && Math.abs(cents(fb, fa)) > GLIDE_CENTS;
    if (f < minHz * 1.05 || f > maxHz / 1.05 || steepLow) why = 'range';
    else if (stepsIn(o / sr - STEP_GUARD_SECONDS, (o + span) / sr + STEP_GUARD_SECONDS)) why = 'path-step';
    else if (input.jumps?.some((j) => j.from <= (o + span) / sr && j.to >= o / sr)) why = 'path-step';
    else if (input.others.some((s) => overlaps(f, input.levelAt?.(t) ?? 1, input.partials, s.expectedHz(t), s.partials, s.levelAt?.(t) ?? 1))) why = 'overlap';
    else if (levels[i] < floor) why = 'level';
    else if (!(heardTrack.frequencies[i] > 0)) why = 'unvoiced';
    else if (!(refTrack.frequencies[i] > 0)) why = 'range';
    else errors[i] = cents(heardTrack.frequencies[i], refTrack.frequencies[i]);
    reasons.push(why);
  }
  return verdict(input, times, expected, heardTrack.frequencies.slice(0, frames), errors, reasons, hop);
}

/**
 * Whether another voice's harmonic can disturb this voice's fundamental f: within OVERLAP_NEAR_CENTS always; otherwise
 * when, after the band-follower's attenuation (four RBJ band-pass passes, Q = 6), it comes within OVERLAP_DB of the
 * fundamental. Levels: the voices' amplitudes at the listener times their partials' shares.
 */
function overlaps(f: number, level: number, partials: readonly number[], other: number, otherPartials: readonly number[], otherLevel: number): boolean {
  if (!(other > 0)) return false;
  const own = (level * partials[0]) / partials.reduce((a, b) => a + b, 0);
  const sum = otherPartials.reduce((a, b) => a + b, 0) || 1;
  for (let k = 1; k <= otherPartials.length; k++) {
    const c = Math.abs(cents(other * k, f));
    if (c > OVERLAP_CENTS) continue;
    if (c < OVERLAP_NEAR_CENTS) return true;
    const r = centsToRatio(c);
    const x = BAND_Q * (r - 1 / r);
    const attenuationDb = 4 * 10 * Math.log10(1 + x * x);
    const theirs = (otherLevel * otherPartials[k - 1]) / sum;
    if (theirs > 0 && gainToDb(theirs / Math.max(own, 1e-12)) - attenuationDb > -OVERLAP_DB) return true;
  }
  return false;
}
