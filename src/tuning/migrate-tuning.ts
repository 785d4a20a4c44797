// Migration of older tuning documents to the current schema (version 0 → 1), keeping the paths of the original file.
import type { Tuning } from './tuning-types';
import type { TuningIssue } from './tuning-error';
import { defaultTuning } from './default-tuning';
import { childPath, itemPath } from './json-path';

/** Issue sink shared with the parser. */
export interface IssueSink {
  readonly list: TuningIssue[];
  add(path: string, message: string): void;
}

type Obj = Record<string, unknown>;

/** Top-level keys of a version-0 document (flat settings; curves as [x, y] pairs, linear). */
export const version0Keys: readonly string[] = ['version', 'temperatureCelsius', 'dopplerFactor', 'slowMotionScale', 'groups'];
const curveNames = ['pitch', 'tone', 'level'];

function isObj(v: unknown): v is Obj {
  return v !== null && typeof v === 'object' && !Array.isArray(v);
}

/** Maps a path in the migrated (version 1) document back to the version-0 file. */
function toVersion0Path(path: string): string {
  if (path === 'air.temperatureCelsius') return 'temperatureCelsius';
  if (path === 'doppler.factor') return 'dopplerFactor';
  if (path === 'timeFlow.slowMotionScale') return 'slowMotionScale';
  const m = /^(groups(?:\.[A-Za-z0-9_-]+|\[".*"\]))\.(pitch|tone|level)\.keys(?:\[(\d+)\](?:\.(x|y))?)?$/.exec(path);
  if (m) return `${m[1]}.${m[2]}${m[3] === undefined ? '' : `[${m[3]}]`}${m[4] === undefined ? '' : m[4] === 'x' ? '[0]' : '[1]'}`;
  return path;
}

function convertCurve(value: unknown, path: string, issues: IssueSink): unknown {
  if (!Array.isArray(value)) {
    issues.add(path, 'expected an array of [x, y] pairs (version 0 curve)');
    return undefined;
  }
  const keys: Obj[] = [];
  value.forEach((pair, i) => {
    if (!Array.isArray(pair) || pair.length !== 2) issues.add(itemPath(path, i), 'expected an [x, y] pair');
    else keys.push({ x: pair[0], y: pair[1] });
  });
  return { interpolation: 'linear', keys };
}

/**
 * Migrates a version-0 document: `temperatureCelsius`, `dopplerFactor` and `slowMotionScale` at the top level,
 * group curves as arrays of [x, y] pairs with linear interpolation; everything else takes the built-in values.
 * Issues found after migration are reported at the version-0 paths.
 */
export function migrateVersion0(doc: Obj, issues: IssueSink, parseCurrent: (doc: Obj, issues: IssueSink) => Tuning): Tuning | undefined {
  for (const key of Object.keys(doc)) {
    if (!version0Keys.includes(key)) issues.add(childPath('', key), `unknown key in a version 0 document (expected one of: ${version0Keys.join(', ')})`);
  }
  const next: Obj = { version: 1 };
  if ('temperatureCelsius' in doc) next.air = { ...defaultTuning.air, temperatureCelsius: doc.temperatureCelsius };
  if ('dopplerFactor' in doc) next.doppler = { ...defaultTuning.doppler, factor: doc.dopplerFactor };
  if ('slowMotionScale' in doc) next.timeFlow = { ...defaultTuning.timeFlow, slowMotionScale: doc.slowMotionScale };
  if ('groups' in doc) {
    const groups = doc.groups;
    if (!isObj(groups)) next.groups = groups;
    else {
      const out: Obj = {};
      for (const name of Object.keys(groups)) {
        const g = groups[name];
        if (!isObj(g)) {
          out[name] = g;
          continue;
        }
        const converted: Obj = { ...g };
        for (const c of curveNames) {
          if (c in g) converted[c] = convertCurve(g[c], childPath(childPath('groups', name), c), issues);
        }
        out[name] = converted;
      }
      next.groups = out;
    }
  }
  if (issues.list.length > 0) return undefined;
  const inner: IssueSink = {
    list: [],
    add(path, message) {
      issues.add(toVersion0Path(path), message);
      this.list.push({ path, message });
    },
  };
  const tuning = parseCurrent(next, inner);
  return inner.list.length > 0 ? undefined : tuning;
}
