// Group policies: how a group's voices respond to the time scale, compiled once from the tuning.
import type { GroupPolicy, GroupTuning } from '../tuning';
import { Curve } from './curve';

/** Whether voices of a policy change speed (and pitch) with the time scale: only 'follow-time'. */
export function policyFollowsSpeed(policy: GroupPolicy): boolean {
  return policy === 'follow-time';
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
  /** Doppler applies to positioned voices of this group. */
  readonly doppler: boolean;
  /** Stealing priority 0…255. */
  readonly priority: number;

  /** Builds the group's curves (throws RangeError on malformed curves; parseTuning output never is). */
  constructor(name: string, group: GroupTuning) {
    this.name = name;
    this.policy = group.policy;
    this.followsSpeed = policyFollowsSpeed(group.policy);
    this.appliesTone = policyAppliesTone(group.policy);
    this.pitch = new Curve(group.pitch);
    this.tone = new Curve(group.tone);
    this.level = new Curve(group.level);
    this.doppler = group.doppler;
    this.priority = group.priority;
  }
}
