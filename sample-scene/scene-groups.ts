// Group names the sample scene asks for, mapped onto whatever groups the running tuning holds, so that any valid
// tuning (even one with only 'effects') plays: the wanted group if present, else 'effects', else the first group.
import type { Tuning } from '../src';
import { DEFAULT_GROUP } from '../src/tuning';

/** The group to play `wanted` sounds in under `tuning` (never throws for a valid tuning). */
export function sceneGroup(tuning: Tuning, wanted: string): string {
  const groups = tuning.groups;
  if (Object.prototype.hasOwnProperty.call(groups, wanted)) return wanted;
  if (Object.prototype.hasOwnProperty.call(groups, DEFAULT_GROUP)) return DEFAULT_GROUP;
  return Object.keys(groups)[0] ?? DEFAULT_GROUP;
}
