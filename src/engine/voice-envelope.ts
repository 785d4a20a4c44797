// The voice envelope: a linear fade as a small state machine (fading in, sustained, holding, thawing, releasing,
// finished), stepped once per block; the gain stage ramps linearly between the levels at the block's two ends.
import type { Hz, Seconds } from '../units';

/** Fade used when a frozen group (time scale 0) or a held voice stops and resumes, s. */
export const FREEZE_FADE_SECONDS: Seconds = 0.02;

/** Envelope phase: rising from silence at the start fade's rate. */
export const ENVELOPE_FADING_IN = 0;
/** Envelope phase: at full level. */
export const ENVELOPE_SUSTAINED = 1;
/** Envelope phase: frozen (time scale 0) or held (pause, seek): falls to silence at the freeze rate and stays there. */
export const ENVELOPE_HOLDING = 2;
/** Envelope phase: rising again after a hold, at the freeze rate. */
export const ENVELOPE_THAWING = 3;
/** Envelope phase: falling to silence after a stop or a steal, at the release rate. */
export const ENVELOPE_RELEASING = 4;
/** Envelope phase: released to silence; the voice is over. */
export const ENVELOPE_FINISHED = 5;

/** One of the ENVELOPE_* phases. */
export type EnvelopePhase = 0 | 1 | 2 | 3 | 4 | 5;

/** A voice's fade level 0…1 and its phase; stepping it allocates nothing. */
export class VoiceEnvelope {
  /** Level at the block's start (0…1), set by `step`. */
  start = 0.5;
  /** Level at the block's end (0…1), set by `step`; also the level now. */
  level = 0.5;
  private phaseNow: EnvelopePhase = ENVELOPE_FINISHED;
  private attackStep = 0.5;
  private releaseStep = 0.5;
  private readonly freezeStep: number;
  private readonly sampleRate: Hz;

  /** An envelope at silence, finished, for output rate `sampleRate` (Hz). */
  constructor(sampleRate: Hz) {
    this.sampleRate = sampleRate;
    this.freezeStep = 1 / (FREEZE_FADE_SECONDS * sampleRate);
    this.start = 0;
    this.level = 0;
  }

  /** The current phase (ENVELOPE_*). */
  get phase(): EnvelopePhase {
    return this.phaseNow;
  }

  /** Level change per sample for a fade of `seconds` (0, negative or non-finite: 1, at once). */
  fadeStep(seconds: Seconds): number {
    return seconds > 0 && seconds < Infinity ? 1 / (seconds * this.sampleRate) : 1;
  }

  /** Starts a voice: fades in over `fadeInSeconds` (0 = starts at full level); a later release defaults to `releaseSeconds`. */
  begin(fadeInSeconds: Seconds, releaseSeconds: Seconds): void {
    this.level = fadeInSeconds > 0 ? 0 : 1;
    this.start = this.level;
    this.phaseNow = this.level === 1 ? ENVELOPE_SUSTAINED : ENVELOPE_FADING_IN;
    this.attackStep = this.fadeStep(fadeInSeconds);
    this.releaseStep = this.fadeStep(releaseSeconds);
  }

  /** Fades out over `fadeSeconds` (s); the envelope finishes at silence. */
  release(fadeSeconds: Seconds): void {
    this.phaseNow = ENVELOPE_RELEASING;
    this.releaseStep = this.fadeStep(fadeSeconds);
  }

  /**
   * Steps one block of `frames`: a playing voice holds while `frozen` and thaws after. Returns true when the voice
   * resumes from silence in this block (its pitch then restarts at its target, masked by the thaw).
   */
  step(frozen: boolean, frames: number): boolean {
    let phase = this.phaseNow;
    const startLevel = this.level;
    let resumed = false;
    if (phase !== ENVELOPE_RELEASING && phase !== ENVELOPE_FINISHED) {
      if (frozen) phase = ENVELOPE_HOLDING;
      else if (phase === ENVELOPE_HOLDING || phase === ENVELOPE_THAWING) {
        resumed = startLevel === 0;
        phase = ENVELOPE_THAWING;
      }
    }
    const target = phase === ENVELOPE_FADING_IN || phase === ENVELOPE_SUSTAINED || phase === ENVELOPE_THAWING ? 1 : 0;
    const rising = target > startLevel;
    const perSample = rising ? (phase === ENVELOPE_THAWING ? this.freezeStep : this.attackStep) : phase === ENVELOPE_RELEASING ? this.releaseStep : this.freezeStep;
    const step = perSample * frames;
    const end = rising ? Math.min(target, startLevel + step) : Math.max(target, startLevel - step);
    if (end === 1 && (phase === ENVELOPE_FADING_IN || phase === ENVELOPE_THAWING)) phase = ENVELOPE_SUSTAINED;
    else if (end === 0 && phase === ENVELOPE_RELEASING) phase = ENVELOPE_FINISHED;
    this.phaseNow = phase;
    this.start = startLevel;
    this.level = end;
    return resumed;
  }
}
