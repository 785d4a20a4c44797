// Group policies: how a group's voices respond to the time scale, compiled once from the tuning.
import type { GroupPolicy, GroupTuning, MotionModel } from '../tuning';
import { Curve } from './curve';
import { centsToRatioAt, dbToGainAt } from '../dsp';

/** Whether voices of a policy change speed with the time scale: 'follow-time' (pitch too) and 'stretch' (pitch apart). */
export function policyFollowsSpeed(policy: GroupPolicy): boolean {
  return policy === 'follow-time' || policy === 'stretch';
}

/** Whether tone (low-pass) and level curves apply: 'follow-time' and 'tone-only'. */
export function policyAppliesTone(policy: GroupPolicy): boolean {
  return policy !== 'exempt';
}

/** A group's tuning with its curves built, ready for per-frame evaluation. */
export class CompiledGroup {
  /** Group name. */
  readonly name: string;
  /** Policy from the tuning. */
  readonly policy: GroupPolicy;
  /** Speed and pitch follow pitch(s). */
  readonly followsSpeed: boolean;
  /** Tone and level curves apply. */
  readonly appliesTone: boolean;
  /** s → speed multiplier, 0…4. */
  readonly pitch: Curve;
  /** s → cutoff in Hz. */
  readonly tone: Curve;
  /** s → level in dB. */
  readonly level: Curve;
  /** The same-instant Doppler ratio applies to positioned voices of this group: motion 'instant', and 'stretch' groups whose motion is not 'off' (the propagation path does not carry stretched voices). */
  readonly doppler: boolean;
  /** How positioned voices hear motion: 'off' also when the tuning's `doppler` is false. */
  readonly motion: MotionModel;
  /** Stealing priority 0…255. */
  readonly priority: number;
  /** Voices keep their pitch apart from their speed (time-scale modification, src/stretch). */
  readonly stretches: boolean;
  /** s → pitch shift in cents of 'stretch' voices (0 = pitch kept). */
  readonly stretchPitch: Curve;
  /** 'stretch' voices hold their sound at time scale 0 instead of fading to silence. */
  readonly holdsWhenFrozen: boolean;

  /** Time scale of the cached curve values below (NaN = none yet). */
  cachedScale = Number.NaN;
  /** pitch(cachedScale), or 1 when the policy keeps speed. */
  cachedSpeed = 1;
  /** tone(cachedScale) clamped to 20…20000 Hz, or open when exempt. */
  cachedCutoffHz = 20000;
  /** 10^(level(cachedScale)/20), or 1 when exempt. */
  cachedLevelGain = 1;
  /** 2^(stretchPitch(cachedScale)/1200) for 'stretch' groups: the pitch ratio apart from Doppler; else cachedSpeed. */
  cachedPitch = 1;
  /** One slot for the in-place unit conversions (dbToGainAt, centsToRatioAt). */
  private readonly unit = new Float64Array(1);

  /** Time scale (0…4) `evaluate` reads: a field, since a double passed to a call V8 does not inline is boxed. */
  scaleQuery = 0.5;

  /** Evaluates the curves at time scale `scaleQuery` into the cached fields; reuses them when it is unchanged. */
  evaluate(minCutoffHz: number, openCutoffHz: number): void {
    const s = this.scaleQuery;
    if (s === this.cachedScale) return;
    this.cachedScale = s;
    // Curves read and write their doubles in fields, and each branch stores its own value: V8 boxes a double passed to
    // or returned from a call it does not inline, and one merged with a constant (docs/allocation.md).
    if (this.followsSpeed) {
      const pitch = this.pitch;
      pitch.x = s;
      pitch.lookUp();
      this.cachedSpeed = pitch.y;
    } else this.cachedSpeed = 1;
    if (this.stretches) {
      const sp = this.stretchPitch;
      sp.x = s;
      sp.lookUp();
      const u = this.unit;
      u[0] = sp.y;
      centsToRatioAt(u, 0);
      this.cachedPitch = u[0];
    } else this.cachedPitch = this.cachedSpeed;
    if (this.appliesTone) {
      const tone = this.tone;
      tone.x = s;
      tone.lookUp();
      const c = tone.y;
      if (c < minCutoffHz) this.cachedCutoffHz = minCutoffHz;
      else if (c > openCutoffHz) this.cachedCutoffHz = openCutoffHz;
      else this.cachedCutoffHz = c;
      const level = this.level;
      level.x = s;
      level.lookUp();
      const u = this.unit;
      u[0] = level.y;
      dbToGainAt(u, 0);
      this.cachedLevelGain = u[0];
    } else {
      this.cachedCutoffHz = openCutoffHz;
      this.cachedLevelGain = 1;
    }
  }

  /** Builds the group's curves (throws RangeError on malformed curves; parseTuning output never is). */
  constructor(name: string, group: GroupTuning) {
    this.name = name;
    this.policy = group.policy;
    this.followsSpeed = policyFollowsSpeed(group.policy);
    this.appliesTone = policyAppliesTone(group.policy);
    this.pitch = new Curve(group.pitch);
    this.tone = new Curve(group.tone);
    this.level = new Curve(group.level);
    this.motion = group.doppler ? (group.motion ?? 'propagation') : 'off';
    this.priority = group.priority;
    this.stretches = group.policy === 'stretch';
    this.doppler = this.motion === 'instant' || (this.stretches && this.motion !== 'off');
    this.stretchPitch = new Curve(group.stretchPitch ?? { interpolation: 'linear', keys: [{ x: 0, y: 0 }] });
    this.holdsWhenFrozen = this.stretches && group.stretchFreeze === 'hold';
  }
}
