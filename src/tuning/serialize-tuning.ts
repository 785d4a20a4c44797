// Canonical JSON text of a tuning: fixed key order, two-space indent, trailing newline.
import type { CurveSpec, GroupTuning, Tuning } from './tuning-types';
import { parseTuning } from './parse-tuning';
import { groupLimits, groupOptionalLimits, sectionLimits } from './tuning-limits';

function ordered(source: Record<string, unknown>, keys: readonly string[]): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const k of keys) out[k] = source[k];
  return out;
}

function curve(c: CurveSpec): Record<string, unknown> {
  return { interpolation: c.interpolation, keys: c.keys.map((k) => ({ x: k.x, y: k.y })) };
}

function group(g: GroupTuning): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const k of Object.keys(groupLimits) as (keyof typeof groupLimits)[]) {
    out[k] = groupLimits[k] === 'curve' ? curve(g[k] as CurveSpec) : g[k];
  }
  for (const k of Object.keys(groupOptionalLimits) as (keyof typeof groupOptionalLimits)[]) {
    out[k] = groupOptionalLimits[k] === 'curve' ? curve(g[k] as CurveSpec) : g[k];
  }
  return out;
}

/**
 * Serialises a tuning to canonical JSON text (validated first: throws TuningError if it is not a valid tuning).
 * parseTuning(serializeTuning(t)) deep-equals t, and serializing the result again gives the same text.
 */
export function serializeTuning(tuning: Tuning): string {
  const t = parseTuning(tuning);
  const doc: Record<string, unknown> = { version: t.version };
  for (const name of Object.keys(sectionLimits) as (keyof typeof sectionLimits)[]) {
    doc[name] = ordered(t[name], Object.keys(sectionLimits[name]));
  }
  const groups: Record<string, unknown> = {};
  for (const name of Object.keys(t.groups)) groups[name] = group(t.groups[name]);
  doc.groups = groups;
  return `${JSON.stringify(doc, null, 2)}\n`;
}
