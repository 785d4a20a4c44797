// Tuning document parser: strict structural validation with JSON paths, version migration, deep freeze.
import type { CurveSpec, GroupTuning, Tuning } from './tuning-types';
import { DEFAULT_GROUP, TUNING_VERSION, defaultTuning } from './default-tuning';
import { TuningError, type TuningIssue } from './tuning-error';
import { childPath, itemPath } from './json-path';
import { findDuplicateKeys, MAX_TUNING_TEXT } from './json-text';
import { describe, isPlainObject, scanTree } from './scan-tree';
import { migrateVersion0, type IssueSink } from './migrate-tuning';
import {
  curveLimits,
  groupLimits,
  groupOptionalLimits,
  groupOptionalDefaults,
  groupsLimits,
  sectionLimits,
  topLevelKeys,
  type FieldLimit,
  type SectionName,
} from './tuning-limits';

const MAX_ISSUES = 100;
/** Optional top-level key naming the JSON Schema for editors; accepted and not kept. */
const SCHEMA_KEY = '$schema';

type Json = unknown;
type Obj = Record<string, Json>;

/** Collects issues and stops adding after MAX_ISSUES. */
class Issues implements IssueSink {
  readonly list: TuningIssue[] = [];
  add(path: string, message: string): void {
    if (this.list.length < MAX_ISSUES) this.list.push({ path, message });
  }
}

function checkKeys(obj: Obj, allowed: readonly string[], path: string, issues: IssueSink): void {
  for (const key of Object.keys(obj)) {
    if (!allowed.includes(key)) issues.add(childPath(path, key), `unknown key (expected one of: ${allowed.join(', ')})`);
  }
}

function objectAt(value: Json, path: string, issues: IssueSink): Obj | undefined {
  if (isPlainObject(value)) return value;
  issues.add(path, `expected an object, got ${describe(value)}`);
  return undefined;
}

/** Validates one scalar field; returns the value to keep (−0 normalised to 0) or undefined. */
function field(obj: Obj, key: string, limit: FieldLimit, path: string, issues: IssueSink): Json {
  const p = childPath(path, key);
  if (!Object.prototype.hasOwnProperty.call(obj, key)) {
    if (limit.kind !== 'boolean' && limit.optional !== undefined) return limit.optional;
    issues.add(p, 'missing field');
    return undefined;
  }
  return scalar(obj[key], limit, p, issues);
}

function scalar(value: Json, limit: FieldLimit, p: string, issues: IssueSink): Json {
  if (limit.kind === 'boolean') {
    if (typeof value !== 'boolean') issues.add(p, `expected true or false, got ${describe(value)}`);
    return value;
  }
  if (limit.kind === 'enum') {
    if (typeof value !== 'string' || !limit.values.includes(value)) {
      issues.add(p, `expected one of ${limit.values.map((v) => `"${v}"`).join(', ')}, got ${describe(value)}`);
    }
    return value;
  }
  if (value === null && limit.nullable) return null;
  if (typeof value !== 'number') {
    issues.add(p, `expected a number${limit.nullable ? ' or null' : ''}, got ${describe(value)}`);
    return undefined;
  }
  if (!Number.isFinite(value)) {
    issues.add(p, `must be a finite number, got ${describe(value)}`);
    return undefined;
  }
  if (limit.integer && !Number.isInteger(value)) issues.add(p, `must be a whole number, got ${value}`);
  if (value < limit.min || value > limit.max) issues.add(p, `out of range: ${value} is not within ${limit.min}…${limit.max}`);
  return value === 0 ? 0 : value;
}

function parseSection(name: SectionName, value: Json, issues: IssueSink): Obj {
  const path = name;
  const limits = sectionLimits[name] as Record<string, FieldLimit>;
  const obj = objectAt(value, path, issues);
  const out: Obj = {};
  if (!obj) return out;
  const keys = Object.keys(limits);
  checkKeys(obj, keys, path, issues);
  for (const key of keys) out[key] = field(obj, key, limits[key], path, issues);
  return out;
}

function parseCurve(value: Json, kind: keyof typeof curveLimits.y, path: string, issues: IssueSink): CurveSpec | undefined {
  const obj = objectAt(value, path, issues);
  if (!obj) return undefined;
  checkKeys(obj, ['interpolation', 'keys'], path, issues);
  const interpolation = field(obj, 'interpolation', curveLimits.interpolation, path, issues) as CurveSpec['interpolation'];
  const keysPath = childPath(path, 'keys');
  if (!Object.prototype.hasOwnProperty.call(obj, 'keys')) {
    issues.add(keysPath, 'missing field');
    return undefined;
  }
  const keys = obj.keys;
  if (!Array.isArray(keys)) {
    issues.add(keysPath, `expected an array of {x, y} keys, got ${describe(keys)}`);
    return undefined;
  }
  if (keys.length < curveLimits.minKeys || keys.length > curveLimits.maxKeys) {
    issues.add(keysPath, `expected ${curveLimits.minKeys}…${curveLimits.maxKeys} keys, got ${keys.length}`);
  }
  const out: { x: number; y: number }[] = [];
  let prevX = -Infinity;
  for (let i = 0; i < keys.length && i < curveLimits.maxKeys; i++) {
    const kp = itemPath(keysPath, i);
    const key = objectAt(keys[i], kp, issues);
    if (!key) continue;
    checkKeys(key, ['x', 'y'], kp, issues);
    const x = field(key, 'x', curveLimits.x, kp, issues) as number | undefined;
    const y = field(key, 'y', curveLimits.y[kind], kp, issues) as number | undefined;
    if (typeof x === 'number') {
      if (x === prevX) issues.add(childPath(kp, 'x'), `duplicate x ${x} (keys[${i - 1}] has the same x)`);
      else if (x < prevX) issues.add(childPath(kp, 'x'), `keys must be sorted by increasing x: ${x} comes after ${prevX}`);
      else if (x - prevX < curveLimits.minSpacing) issues.add(childPath(kp, 'x'), `keys closer than ${curveLimits.minSpacing} in x to keys[${i - 1}]`);
      prevX = Math.max(prevX, x);
    }
    out.push({ x: x as number, y: y as number });
  }
  return { interpolation, keys: out };
}

function parseGroup(value: Json, path: string, issues: IssueSink): GroupTuning | undefined {
  const obj = objectAt(value, path, issues);
  if (!obj) return undefined;
  const keys = Object.keys(groupLimits);
  checkKeys(obj, [...keys, ...Object.keys(groupOptionalLimits)], path, issues);
  const out: Obj = {};
  for (const key of keys) {
    const limit = groupLimits[key as keyof typeof groupLimits];
    if (limit === 'curve') {
      const p = childPath(path, key);
      if (!Object.prototype.hasOwnProperty.call(obj, key)) issues.add(p, 'missing field');
      else out[key] = parseCurve(obj[key], key as 'pitch' | 'tone' | 'level', p, issues);
    } else {
      out[key] = field(obj, key, limit, path, issues);
    }
  }
  for (const key of Object.keys(groupOptionalLimits) as (keyof typeof groupOptionalLimits)[]) {
    const limit = groupOptionalLimits[key];
    if (!Object.prototype.hasOwnProperty.call(obj, key)) out[key] = groupOptionalDefaults[key];
    else if (limit === 'curve') out[key] = parseCurve(obj[key], key as 'stretchPitch', childPath(path, key), issues);
    else out[key] = field(obj, key, limit, path, issues);
  }
  assembledAs<GroupTuning>(out);
  return out;
}

function parseGroups(value: Json, issues: IssueSink): Obj {
  const path = 'groups';
  const out: Obj = {};
  const obj = objectAt(value, path, issues);
  if (!obj) return out;
  const names = Object.keys(obj);
  if (names.length < groupsLimits.minGroups || names.length > groupsLimits.maxGroups) {
    issues.add(path, `expected ${groupsLimits.minGroups}…${groupsLimits.maxGroups} groups, got ${names.length}`);
  }
  for (const name of names) {
    const p = childPath(path, name);
    if (!groupsLimits.namePattern.test(name)) {
      issues.add(p, 'group names start with a letter and use only letters, digits, "-" and "_" (at most 64 characters)');
    } else if (name in Object.prototype || name === 'prototype') {
      issues.add(p, `"${name}" is a reserved name`);
    } else {
      out[name] = parseGroup(obj[name], p, issues);
    }
  }
  if (!Object.prototype.hasOwnProperty.call(obj, groupsLimits.requiredGroup)) {
    issues.add(path, `missing group "${groupsLimits.requiredGroup}" (the group voices fall back to)`);
  }
  return out;
}

function parseVersion(doc: Obj, issues: IssueSink): number | undefined {
  if (!Object.prototype.hasOwnProperty.call(doc, 'version')) {
    issues.add('version', `missing field (the current schema version is ${TUNING_VERSION})`);
    return undefined;
  }
  const v = doc.version;
  if (typeof v !== 'number' || !Number.isInteger(v) || v < 0) {
    issues.add('version', `expected a whole schema version number (0…${TUNING_VERSION}), got ${describe(v)}`);
    return undefined;
  }
  if (v > TUNING_VERSION) {
    issues.add(
      'version',
      `schema version ${v} is newer than this runtime supports (${TUNING_VERSION}); load it with a newer Ralenti, or export it again from an editor of this version`,
    );
    return undefined;
  }
  return v;
}

/** Validates a version-1 document object and builds the complete tuning (not yet frozen). */
function parseVersion1(doc: Obj, issues: IssueSink): Tuning {
  checkKeys(doc, [SCHEMA_KEY, ...topLevelKeys], '', issues);
  if (Object.prototype.hasOwnProperty.call(doc, SCHEMA_KEY) && typeof doc[SCHEMA_KEY] !== 'string') {
    issues.add(SCHEMA_KEY, `expected the schema's URL or path as a string, got ${describe(doc[SCHEMA_KEY])}`);
  }
  const out: Obj = { version: TUNING_VERSION };
  for (const name of Object.keys(sectionLimits) as SectionName[]) {
    out[name] = Object.prototype.hasOwnProperty.call(doc, name) ? parseSection(name, doc[name], issues) : defaultTuning[name];
  }
  out.groups = Object.prototype.hasOwnProperty.call(doc, 'groups') ? parseGroups(doc.groups, issues) : defaultTuning.groups;
  assembledAs<Tuning>(out);
  return out;
}

/**
 * Marks `out`, assembled key by key from the limits table, as a T. The compiler cannot follow that assembly; every
 * field was checked against its limit on the way, and parseTuning throws when any check recorded an issue.
 */
function assembledAs<T>(out: Obj): asserts out is Obj & T {
  void out;
}

function deepFreeze<T>(value: T): T {
  if (value !== null && typeof value === 'object' && !Object.isFrozen(value)) {
    for (const k of Object.keys(value)) deepFreeze((value as Obj)[k]);
    Object.freeze(value);
  }
  return value;
}

/**
 * Parses a tuning document (an object, or its JSON text) into a complete, deeply frozen Tuning.
 * Whole sections (and `groups`) may be omitted and take the built-in values; a present section must be
 * complete. A top-level "$schema" string (for editors) is accepted and dropped. Version 0 documents are migrated. Throws TuningError listing every problem with its JSON path.
 * Text input is refused above MAX_TUNING_TEXT (4 MiB) before parsing, and keys repeated within one object are problems.
 */
export function parseTuning(json: unknown): Tuning {
  const issues: IssueSink = new Issues();
  let input = json;
  if (typeof json === 'string') {
    // Text: size first (before any parsing), then syntax, then keys repeated within an object.
    if (json.length > MAX_TUNING_TEXT) {
      throw new TuningError([{ path: '', message: `the text is ${json.length} characters; a tuning file is at most ${MAX_TUNING_TEXT} (4 MiB)` }]);
    }
    try {
      input = JSON.parse(json);
    } catch (e) {
      throw new TuningError([{ path: '', message: `not valid JSON: ${(e as Error).message}` }]);
    }
    const dups = findDuplicateKeys(json);
    if (dups.length > 0) throw new TuningError(dups.map((d) => ({ path: d.path, message: `duplicate key "${d.key}" (JSON would keep only the last one)` })));
  }
  let result: Tuning | undefined;
  try {
    if (!isPlainObject(input)) {
      issues.add('', `expected a tuning object, got ${describe(input)}`);
    } else {
      scanTree(input, issues);
      if (issues.list.length === 0) {
        const version = parseVersion(input, issues);
        if (version === 0) {
          result = migrateVersion0(input, issues, parseVersion1);
        } else if (version === TUNING_VERSION) {
          result = parseVersion1(input, issues);
        }
      }
    }
  } catch (e) {
    // A getter or proxy in a caller-built object threw: report it rather than crash.
    issues.add('', `could not read the document: ${(e as Error)?.message ?? String(e)}`);
  }
  if (issues.list.length > 0 || result === undefined) throw new TuningError(issues.list);
  return deepFreeze(result);
}

/** The group voices fall back to when theirs is unknown. */
export { DEFAULT_GROUP };
