// The first pass over a tuning document: every value visited once (depth-first, bounded in depth and count),
// forbidden keys and non-JSON values reported with their JSON path, before any field is read.
import { childPath, itemPath } from './json-path';
import { forbiddenKeys } from './tuning-limits';
import type { IssueSink } from './migrate-tuning';

type Json = unknown;
type Obj = Record<string, Json>;

/** Deepest nesting accepted. */
const MAX_DEPTH = 32;

/** A short description of a JSON value for messages ("the string \"x\"", "an array", "NaN"). */
export function describe(value: Json): string {
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'an array';
  if (typeof value === 'number') return Number.isNaN(value) ? 'NaN' : String(value);
  if (typeof value === 'string') return `the string ${JSON.stringify(value.length > 40 ? value.slice(0, 40) + '…' : value)}`;
  return `a ${typeof value}`;
}

/** Whether `value` is a plain object (Object or null prototype), not an array, class instance or proxy-like exotic. */
export function isPlainObject(value: Json): value is Obj {
  if (value === null || typeof value !== 'object' || Array.isArray(value)) return false;
  const proto = Object.getPrototypeOf(value);
  return proto === Object.prototype || proto === null;
}

/** Most values scanned in one document (the largest valid tuning holds about 27,000; caller-built objects have no text size to check): beyond it the document is refused. */
const MAX_NODES = 1_000_000;

/**
 * Rejects forbidden keys and non-JSON values anywhere in the tree, before anything reads it. Paths are built only
 * for issues (from the `trail` of keys and indices), so a large document costs one visit per value.
 */
export function scanTree(root: Json, issues: IssueSink): void {
  const trail: (string | number)[] = [];
  let nodes = 0;
  const pathNow = (): string => {
    let p = '';
    for (const t of trail) p = typeof t === 'number' ? itemPath(p, t) : childPath(p, t);
    return p;
  };
  const visit = (value: Json, depth: number): boolean => {
    if (++nodes > MAX_NODES) {
      issues.add('', `more than ${MAX_NODES} values: not a tuning document`);
      return false;
    }
    if (value === null || typeof value !== 'object') {
      if (typeof value === 'function' || typeof value === 'symbol' || typeof value === 'bigint' || typeof value === 'undefined') {
        issues.add(pathNow(), `expected a JSON value, got ${describe(value)}`);
      }
      return true;
    }
    if (depth > MAX_DEPTH) {
      issues.add(pathNow(), `nested deeper than ${MAX_DEPTH} levels`);
      return true;
    }
    if (Array.isArray(value)) {
      for (let i = 0; i < value.length; i++) {
        trail.push(i);
        const go = visit(value[i], depth + 1);
        trail.pop();
        if (!go) return false;
      }
      return true;
    }
    if (!isPlainObject(value)) {
      issues.add(pathNow(), 'expected a plain JSON object');
      return true;
    }
    for (const key of Object.keys(value)) {
      trail.push(key);
      let go = true;
      if (forbiddenKeys.includes(key)) issues.add(pathNow(), `forbidden key "${key}"`);
      else go = visit(value[key], depth + 1);
      trail.pop();
      if (!go) return false;
    }
    return true;
  };
  visit(root, 0);
}
