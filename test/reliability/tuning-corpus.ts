// A corpus of malformed tuning documents, each with the JSON path its first problem must name.
import { defaultTuning, serializeTuning } from '../../src/tuning';

/** A mutable JSON form of the built-in tuning. */
export type Doc = Record<string, any>;

/** One malformed input: a document built by patching the built-in one, or raw JSON text, or any value. */
export interface CorpusCase {
  name: string;
  /** The input handed to parseTuning. */
  input: () => unknown;
  /** JSON path of the first issue ('' = the document). */
  path: string;
}

/** The built-in tuning as a fresh mutable object. */
export function baseDoc(): Doc {
  return JSON.parse(serializeTuning(defaultTuning));
}

const patch = (fn: (d: Doc) => void) => () => {
  const d = baseDoc();
  fn(d);
  return d;
};
/** A document as JSON text with a substitution applied to the text (numbers JSON cannot hold, duplicate keys…). */
const text = (fn: (t: string) => string) => () => fn(serializeTuning(defaultTuning));
const raw = (value: unknown) => () => value;

const pitch = (d: Doc) => d.groups.effects.pitch;
const tone = (d: Doc) => d.groups.effects.tone;
const level = (d: Doc) => d.groups.effects.level;
const DEEP = 40;
const nested = (depth: number): unknown => (depth === 0 ? 1 : [nested(depth - 1)]);

/** ≥ 50 malformed documents: wrong types at every level, missing and extra fields, non-finite numbers, bad curves, hostile keys. */
export const malformedCorpus: readonly CorpusCase[] = [
  // The document itself
  { name: 'an array as the document', input: raw([]), path: '' },
  { name: 'null as the document', input: raw(null), path: '' },
  { name: 'a number as the document', input: raw(42), path: '' },
  { name: 'empty JSON text', input: raw(''), path: '' },
  { name: 'JSON text truncated in the middle', input: text((t) => t.slice(0, Math.floor(t.length / 2))), path: '' },
  { name: 'JSON text missing its last brace', input: text((t) => t.trimEnd().slice(0, -1)), path: '' },
  { name: 'text that is not JSON at all', input: raw('<tuning version="1"/>'), path: '' },
  { name: 'NaN written bare in the text', input: text((t) => t.replace('"factor": 1', '"factor": NaN')), path: '' },
  { name: 'a class instance as the document', input: raw(new Date(0)), path: '' },
  { name: 'a getter that throws while reading', input: () => Object.defineProperty(baseDoc(), 'air', { enumerable: true, get: () => { throw new Error('boom'); } }), path: '' },
  // version
  { name: 'version missing', input: patch((d) => delete d.version), path: 'version' },
  { name: 'version as a string', input: patch((d) => (d.version = '1')), path: 'version' },
  { name: 'version fractional', input: patch((d) => (d.version = 1.5)), path: 'version' },
  { name: 'version negative', input: patch((d) => (d.version = -1)), path: 'version' },
  { name: 'a newer version', input: patch((d) => (d.version = 2)), path: 'version' },
  { name: 'duplicate version key, the last one bad', input: text((t) => t.replace('"version": 1', '"version": 1, "version": "one"')), path: 'version' },
  // extra and hostile keys
  { name: 'an extra top-level key', input: patch((d) => (d.colour = 'blue')), path: 'colour' },
  { name: '__proto__ at the top level (JSON text)', input: text((t) => t.replace('{', '{"__proto__": {"polluted": true},')), path: '__proto__' },
  { name: 'constructor at the top level', input: patch((d) => (d[String('constructor')] = { prototype: { polluted: true } })), path: 'constructor' },
  { name: 'prototype inside a section', input: patch((d) => (d.air.prototype = { polluted: true })), path: 'air.prototype' },
  { name: '__proto__ inside a group (JSON text)', input: text((t) => t.replace('"policy": "follow-time"', '"__proto__": {"polluted": true}, "policy": "follow-time"')), path: 'groups.effects.__proto__' },
  { name: '__proto__ inside a curve key (JSON text)', input: text((t) => t.replace('"x": 0,', '"x": 0, "__proto__": {"polluted": 1},')), path: 'groups.effects.pitch.keys[0].__proto__' },
  { name: 'a group named constructor', input: patch((d) => (d.groups.constructor = d.groups.effects)), path: 'groups.constructor' },
  { name: 'a group named toString', input: patch((d) => (d.groups.toString = d.groups.effects)), path: 'groups.toString' },
  { name: 'a group name starting with a digit', input: patch((d) => (d.groups['1st'] = d.groups.effects)), path: 'groups["1st"]' },
  { name: 'a group name of 65 characters', input: patch((d) => (d.groups['g'.repeat(65)] = d.groups.effects)), path: `groups.${'g'.repeat(65)}` },
  // sections: wrong types
  { name: 'air as an array', input: patch((d) => (d.air = [20, null])), path: 'air' },
  { name: 'air as null', input: patch((d) => (d.air = null)), path: 'air' },
  { name: 'air as a Date instance', input: patch((d) => (d.air = new Date(0))), path: 'air' },
  { name: 'temperature as a string', input: patch((d) => (d.air.temperatureCelsius = '20')), path: 'air.temperatureCelsius' },
  { name: 'temperature as the string "NaN"', input: patch((d) => (d.air.temperatureCelsius = 'NaN')), path: 'air.temperatureCelsius' },
  { name: 'temperature 1e999 in the text (Infinity)', input: text((t) => t.replace('"temperatureCelsius": 20', '"temperatureCelsius": 1e999')), path: 'air.temperatureCelsius' },
  { name: 'temperature NaN as a value', input: patch((d) => (d.air.temperatureCelsius = NaN)), path: 'air.temperatureCelsius' },
  { name: 'speed of sound as the string "Infinity"', input: patch((d) => (d.air.speedOfSound = 'Infinity')), path: 'air.speedOfSound' },
  { name: 'speed of sound zero', input: patch((d) => (d.air.speedOfSound = 0)), path: 'air.speedOfSound' },
  { name: 'speed of sound missing', input: patch((d) => delete d.air.speedOfSound), path: 'air.speedOfSound' },
  { name: 'speed of sound undefined', input: patch((d) => (d.air.speedOfSound = undefined)), path: 'air.speedOfSound' },
  { name: 'Doppler factor negative', input: patch((d) => (d.doppler.factor = -1)), path: 'doppler.factor' },
  { name: 'Doppler factor 1e300', input: patch((d) => (d.doppler.factor = 1e300)), path: 'doppler.factor' },
  { name: 'Doppler factor -Infinity', input: patch((d) => (d.doppler.factor = -Infinity)), path: 'doppler.factor' },
  { name: 'Doppler factor a BigInt', input: patch((d) => (d.doppler.factor = 1n)), path: 'doppler.factor' },
  { name: 'velocity clock unknown', input: patch((d) => (d.doppler.velocityClock = 'stopwatch')), path: 'doppler.velocityClock' },
  { name: 'teleport speed zero', input: patch((d) => (d.doppler.teleportSpeed = 0)), path: 'doppler.teleportSpeed' },
  { name: 'an extra key in doppler', input: patch((d) => (d.doppler.extra = 1)), path: 'doppler.extra' },
  { name: 'max shift a function', input: patch((d) => (d.doppler.maxShiftCents = () => 1200)), path: 'doppler.maxShiftCents' },
  { name: 'distance model unknown', input: patch((d) => (d.distance.model = 'inverse-square')), path: 'distance.model' },
  { name: 'reference distance negative', input: patch((d) => (d.distance.refDistance = -5)), path: 'distance.refDistance' },
  { name: 'ramp-in of a billion seconds', input: patch((d) => (d.timeFlow.rampInSeconds = 1e9)), path: 'timeFlow.rampInSeconds' },
  { name: 'ramp-out negative', input: patch((d) => (d.timeFlow.rampOutSeconds = -0.1)), path: 'timeFlow.rampOutSeconds' },
  { name: 'easing a number', input: patch((d) => (d.timeFlow.easing = 3)), path: 'timeFlow.easing' },
  { name: 'slow-motion scale above 1', input: patch((d) => (d.timeFlow.slowMotionScale = 1.5)), path: 'timeFlow.slowMotionScale' },
  { name: 'ratio smoothing of an hour', input: patch((d) => (d.smoothing.ratioSeconds = 3600)), path: 'smoothing.ratioSeconds' },
  { name: 'gain smoothing a boolean', input: patch((d) => (d.smoothing.gainSeconds = true)), path: 'smoothing.gainSeconds' },
  { name: 'resampler tier unknown', input: patch((d) => (d.resampler.tier = 'ultra')), path: 'resampler.tier' },
  { name: 'limiter the string "yes"', input: patch((d) => (d.master.limiter = 'yes')), path: 'master.limiter' },
  { name: 'limiter 0', input: patch((d) => (d.master.limiter = 0)), path: 'master.limiter' },
  { name: 'ceiling above 0 dBFS', input: patch((d) => (d.master.ceilingDb = 6)), path: 'master.ceilingDb' },
  { name: 'master gain 1e300', input: patch((d) => (d.master.gainDb = 1e300)), path: 'master.gainDb' },
  // groups
  { name: 'groups as an array', input: patch((d) => (d.groups = [d.groups.effects])), path: 'groups' },
  { name: 'no groups at all', input: patch((d) => (d.groups = {})), path: 'groups' },
  { name: 'groups without effects', input: patch((d) => delete d.groups.effects), path: 'groups' },
  { name: '65 groups', input: patch((d) => { for (let i = 0; i < 65; i++) d.groups[`g${i}`] = d.groups.effects; }), path: 'groups' },
  { name: 'a group as a string', input: patch((d) => (d.groups.vehicles = 'fast')), path: 'groups.vehicles' },
  { name: 'a group policy unknown', input: patch((d) => (d.groups.effects.policy = 'slow')), path: 'groups.effects.policy' },
  { name: 'priority fractional', input: patch((d) => (d.groups.effects.priority = 1.5)), path: 'groups.effects.priority' },
  { name: 'priority 256', input: patch((d) => (d.groups.effects.priority = 256)), path: 'groups.effects.priority' },
  { name: 'priority 1e400 in the text', input: text((t) => t.replace(/"priority": \d+/, '"priority": 1e400')), path: 'groups.effects.priority' },
  { name: 'doppler flag the string "true"', input: patch((d) => (d.groups.effects.doppler = 'true')), path: 'groups.effects.doppler' },
  { name: 'pitch curve missing', input: patch((d) => delete d.groups.effects.pitch), path: 'groups.effects.pitch' },
  { name: 'an extra field in a group', input: patch((d) => (d.groups.effects.volume = 1)), path: 'groups.effects.volume' },
  // curves
  { name: 'pitch curve as a number', input: patch((d) => (d.groups.effects.pitch = 1)), path: 'groups.effects.pitch' },
  { name: 'empty curve', input: patch((d) => (pitch(d).keys = [])), path: 'groups.effects.pitch.keys' },
  { name: 'curve keys as an object', input: patch((d) => (pitch(d).keys = { 0: { x: 0, y: 0 } })), path: 'groups.effects.pitch.keys' },
  { name: 'curve keys missing', input: patch((d) => delete pitch(d).keys), path: 'groups.effects.pitch.keys' },
  { name: 'a huge curve (100,000 keys)', input: patch((d) => (pitch(d).keys = Array.from({ length: 100000 }, (_, i) => ({ x: (4 * i) / 100000, y: 1 })))), path: 'groups.effects.pitch.keys' },
  { name: 'unsorted curve keys', input: patch((d) => (pitch(d).keys = [{ x: 1, y: 1 }, { x: 0.5, y: 0.5 }])), path: 'groups.effects.pitch.keys[1].x' },
  { name: 'duplicate curve keys', input: patch((d) => (pitch(d).keys = [{ x: 1, y: 1 }, { x: 1, y: 2 }])), path: 'groups.effects.pitch.keys[1].x' },
  { name: 'curve keys 1e-9 apart', input: patch((d) => (pitch(d).keys = [{ x: 1, y: 1 }, { x: 1 + 1e-9, y: 2 }])), path: 'groups.effects.pitch.keys[1].x' },
  { name: 'a curve key as a number', input: patch((d) => (pitch(d).keys[0] = 0)), path: 'groups.effects.pitch.keys[0]' },
  { name: 'a curve key as an [x, y] pair', input: patch((d) => (pitch(d).keys[0] = [0, 0])), path: 'groups.effects.pitch.keys[0]' },
  { name: 'a curve key missing y', input: patch((d) => delete pitch(d).keys[0].y), path: 'groups.effects.pitch.keys[0].y' },
  { name: 'a curve key x as a string', input: patch((d) => (pitch(d).keys[0].x = '0')), path: 'groups.effects.pitch.keys[0].x' },
  { name: 'a curve key x negative', input: patch((d) => (pitch(d).keys[0].x = -1)), path: 'groups.effects.pitch.keys[0].x' },
  { name: 'a curve key x beyond the largest time scale', input: patch((d) => (pitch(d).keys = [{ x: 5, y: 1 }])), path: 'groups.effects.pitch.keys[0].x' },
  { name: 'a pitch of 1e300', input: patch((d) => (pitch(d).keys[0].y = 1e300)), path: 'groups.effects.pitch.keys[0].y' },
  { name: 'a negative cutoff', input: patch((d) => (tone(d).keys[0].y = -1000)), path: 'groups.effects.tone.keys[0].y' },
  { name: 'a zero cutoff', input: patch((d) => (tone(d).keys[0].y = 0)), path: 'groups.effects.tone.keys[0].y' },
  { name: 'a level of "NaN" as a string', input: patch((d) => (level(d).keys[0].y = 'NaN')), path: 'groups.effects.level.keys[0].y' },
  { name: 'a level of -Infinity', input: patch((d) => (level(d).keys[0].y = -Infinity)), path: 'groups.effects.level.keys[0].y' },
  { name: 'an unknown interpolation', input: patch((d) => (pitch(d).interpolation = 'cubic')), path: 'groups.effects.pitch.interpolation' },
  { name: 'an extra key in a curve', input: patch((d) => (tone(d).tension = 0.5)), path: 'groups.effects.tone.tension' },
  { name: 'an extra key in a curve key', input: patch((d) => (tone(d).keys[0].z = 0)), path: 'groups.effects.tone.keys[0].z' },
  // nesting
  { name: `arrays nested ${DEEP} deep in a curve value`, input: patch((d) => (level(d).keys[0].y = nested(DEEP))), path: 'groups.effects.level.keys[0].y' + '[0]'.repeat(27) },
  { name: 'arrays nested 100,000 deep in the text', input: raw('{"version":1,"x":' + '['.repeat(100000) + ']'.repeat(100000) + '}'), path: 'x' + '[0]'.repeat(32) },
  // version 0 documents keep their own paths
  { name: 'a version 0 document with a bad Doppler factor', input: raw({ version: 0, dopplerFactor: -2 }), path: 'dopplerFactor' },
  { name: 'a version 0 document with an unknown key', input: raw({ version: 0, speed: 1 }), path: 'speed' },
  { name: 'a version 0 curve pair with three numbers', input: raw({ version: 0, groups: { effects: { pitch: [[0, 0, 0]] } } }), path: 'groups.effects.pitch[0]' },
];
