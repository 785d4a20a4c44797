// Parser of the scene script (see scene-types.ts and docs/cli.md "Scene scripts"): validates a
// JSON value, fills defaults and reports every problem with its JSON path.
import { ScriptError, type ScriptIssue } from './script-error';
import type {
  ListenerSpec,
  MotionSpec,
  NoiseColour,
  SceneScript,
  SoundSpec,
  SourceSpec,
  TimeScaleKey,
  Triple,
  VoiceSpec,
} from './scene-types';

/** Current scene-script version. */
export const SCENE_SCRIPT_VERSION = 1;

type Obj = Record<string, unknown>;
const NAME = /^[A-Za-z][A-Za-z0-9_-]{0,63}$/;

class Reader {
  readonly issues: ScriptIssue[] = [];
  fail(path: string, message: string): void {
    if (this.issues.length < 100) this.issues.push({ path, message });
  }
  object(v: unknown, path: string): Obj | null {
    if (v !== null && typeof v === 'object' && !Array.isArray(v)) return v as Obj;
    this.fail(path, `expected an object, got ${describe(v)}`);
    return null;
  }
  known(o: Obj, path: string, keys: readonly string[]): void {
    for (const k of Object.keys(o)) if (!keys.includes(k)) this.fail(join(path, k), `unknown field (expected one of ${keys.join(', ')})`);
  }
  number(o: Obj, key: string, path: string, def: number | undefined, min: number, max: number, exclusiveMin = false): number {
    const v = o[key];
    const p = join(path, key);
    if (v === undefined && def !== undefined) return def;
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      this.fail(p, v === undefined ? 'required number is missing' : `expected a finite number, got ${describe(v)}`);
      return def ?? min;
    }
    if (v < min || v > max || (exclusiveMin && v === min)) {
      this.fail(p, `expected a number in ${exclusiveMin ? '(' : '['}${min}, ${max}], got ${v}`);
      return def ?? min;
    }
    return v;
  }
  /** An optional [low, high] pair of numbers in min…max with low ≤ high, or null. */
  optionalRange(o: Obj, key: string, path: string, min: number, max: number): [number, number] | null {
    const v = o[key];
    if (v === undefined || v === null) return null;
    if (!Array.isArray(v) || v.length !== 2) {
      this.fail(join(path, key), `expected [low, high], got ${describe(v)}`);
      return null;
    }
    const pair = { low: v[0], high: v[1] } as Obj;
    const low = this.number(pair, 'low', join(path, key), undefined, min, max);
    const high = this.number(pair, 'high', join(path, key), undefined, low, max);
    return [low, high];
  }
  optionalNumber(o: Obj, key: string, path: string, min: number, max: number): number | null {
    return o[key] === undefined || o[key] === null ? null : this.number(o, key, path, undefined, min, max);
  }
  string(o: Obj, key: string, path: string, def?: string): string {
    const v = o[key];
    if (v === undefined && def !== undefined) return def;
    if (typeof v !== 'string' || v === '') {
      this.fail(join(path, key), v === undefined ? 'required string is missing' : `expected a non-empty string, got ${describe(v)}`);
      return def ?? '';
    }
    return v;
  }
  choice<T extends string>(o: Obj, key: string, path: string, options: readonly T[], def: T): T {
    const v = o[key];
    if (v === undefined) return def;
    if (typeof v !== 'string' || !options.includes(v as T)) {
      this.fail(join(path, key), `expected one of ${options.map((s) => `"${s}"`).join(', ')}, got ${describe(v)}`);
      return def;
    }
    return v as T;
  }
  bool(o: Obj, key: string, path: string, def: boolean): boolean {
    const v = o[key];
    if (v === undefined) return def;
    if (typeof v !== 'boolean') {
      this.fail(join(path, key), `expected true or false, got ${describe(v)}`);
      return def;
    }
    return v;
  }
  triple(o: Obj, key: string, path: string, def?: Triple): Triple {
    const v = o[key];
    const p = join(path, key);
    if (v === undefined && def) return def;
    if (!Array.isArray(v) || v.length !== 3 || !v.every((x) => typeof x === 'number' && Number.isFinite(x) && Math.abs(x) <= 1e7)) {
      this.fail(p, `expected [x, y, z] of finite numbers (|value| ≤ 1e7), got ${describe(v)}`);
      return def ?? [0, 0, 0];
    }
    return [v[0], v[1], v[2]];
  }
}

function join(path: string, key: string | number): string {
  if (typeof key === 'number') return `${path}[${key}]`;
  return path === '' ? key : `${path}.${key}`;
}

function describe(v: unknown): string {
  if (v === undefined) return 'nothing';
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'an array';
  if (typeof v === 'string') return `"${v.length > 40 ? `${v.slice(0, 40)}…` : v}"`;
  if (typeof v === 'object') return 'an object';
  return String(v);
}

function parseSound(r: Reader, v: unknown, path: string): SoundSpec | null {
  const o = r.object(v, path);
  if (!o) return null;
  const type = r.choice(o, 'type', path, ['tone', 'hum', 'noise', 'file'] as const, 'tone');
  if (o.type === undefined) r.fail(join(path, 'type'), 'required: "tone", "hum", "noise" or "file"');
  if (type === 'file') {
    r.known(o, path, ['type', 'path']);
    return { type, path: r.string(o, 'path', path) };
  }
  const common = {
    seconds: r.number(o, 'seconds', path, 2, 0, 600, true),
    gain: r.number(o, 'gain', path, 0.5, 0, 1),
    sampleRate: r.optionalNumber(o, 'sampleRate', path, 8000, 192000),
  };
  if (common.sampleRate !== null && !Number.isInteger(common.sampleRate)) r.fail(join(path, 'sampleRate'), `expected a whole number of hertz, got ${common.sampleRate}`);
  if (type === 'noise') {
    r.known(o, path, ['type', 'colour', 'seed', 'seconds', 'gain', 'sampleRate']);
    const colour: NoiseColour = r.choice(o, 'colour', path, ['white', 'pink', 'brown'] as const, 'white');
    const seed = r.number(o, 'seed', path, 1, 0, 0xffffffff);
    if (!Number.isInteger(seed)) r.fail(join(path, 'seed'), `expected an integer, got ${seed}`);
    return { type, colour, seed, ...common };
  }
  const frequency = r.number(o, 'frequency', path, undefined, 0, 24000, true);
  if (type === 'tone') {
    r.known(o, path, ['type', 'frequency', 'seconds', 'gain', 'sampleRate']);
    return { type, frequency, ...common };
  }
  r.known(o, path, ['type', 'frequency', 'partials', 'seconds', 'gain', 'sampleRate']);
  let partials: number[] = [1, 0.5, 0.33, 0.25];
  if (o.partials !== undefined) {
    const p = o.partials;
    if (!Array.isArray(p) || p.length < 1 || p.length > 64 || !p.every((x) => typeof x === 'number' && Number.isFinite(x) && x >= 0) || !p.some((x) => x > 0)) {
      r.fail(join(path, 'partials'), `expected 1…64 non-negative amplitudes, not all zero, got ${describe(p)}`);
    } else partials = p as number[];
  }
  return { type, frequency, partials, ...common };
}

function parseMotion(r: Reader, v: unknown, path: string): MotionSpec {
  const fallback: MotionSpec = { type: 'fixed', position: [0, 0, 0] };
  const o = r.object(v, path);
  if (!o) return fallback;
  const type = r.choice(o, 'type', path, ['fixed', 'line', 'circle', 'keyframes'] as const, 'fixed');
  if (type === 'fixed') {
    r.known(o, path, ['type', 'position']);
    return { type, position: r.triple(o, 'position', path) };
  }
  if (type === 'line') {
    r.known(o, path, ['type', 'from', 'velocity', 'time']);
    return { type, from: r.triple(o, 'from', path), velocity: r.triple(o, 'velocity', path), time: r.number(o, 'time', path, 0, -1e6, 1e6) };
  }
  if (type === 'circle') {
    r.known(o, path, ['type', 'center', 'radius', 'periodSeconds', 'plane', 'phaseDegrees']);
    return {
      type,
      center: r.triple(o, 'center', path, [0, 0, 0]),
      radius: r.number(o, 'radius', path, undefined, 0, 1e6),
      periodSeconds: r.number(o, 'periodSeconds', path, undefined, 0, 1e6, true),
      plane: r.choice(o, 'plane', path, ['xz', 'xy', 'yz'] as const, 'xz'),
      phaseDegrees: r.number(o, 'phaseDegrees', path, 0, -360, 360),
    };
  }
  r.known(o, path, ['type', 'interpolation', 'keys']);
  const interpolation = r.choice(o, 'interpolation', path, ['linear', 'cubic'] as const, 'linear');
  const keys: { time: number; position: Triple; cut?: boolean }[] = [];
  const kp = join(path, 'keys');
  if (!Array.isArray(o.keys) || o.keys.length === 0) r.fail(kp, `expected a non-empty array of { time, position }, got ${describe(o.keys)}`);
  else
    o.keys.forEach((k, i) => {
      const ko = r.object(k, join(kp, i));
      if (!ko) return;
      r.known(ko, join(kp, i), ['time', 'position', 'cut']);
      const time = r.number(ko, 'time', join(kp, i), undefined, -1e6, 1e6);
      if (keys.length > 0 && time <= keys[keys.length - 1].time) r.fail(join(join(kp, i), 'time'), `key times must increase strictly (previous ${keys[keys.length - 1].time})`);
      const position = r.triple(ko, 'position', join(kp, i));
      if (r.bool(ko, 'cut', join(kp, i), false)) keys.push({ time, position, cut: true });
      else keys.push({ time, position });
    });
  return { type, interpolation, keys };
}

/** Validates a scene script (parsed JSON) and fills defaults; throws ScriptError listing every problem with its path. */
export function parseSceneScript(json: unknown): SceneScript {
  const r = new Reader();
  const root = r.object(json, '');
  if (!root) throw new ScriptError(r.issues);
  r.known(root, '', ['version', 'duration', 'sampleRate', 'velocities', 'snapshotRate', 'tuning', 'sounds', 'sources', 'listener', 'timeScale', 'voices', 'title', 'seed']);
  const version = r.number(root, 'version', '', SCENE_SCRIPT_VERSION, 1, 1);
  const duration = r.number(root, 'duration', '', undefined, 0, 3600, true);
  const sampleRate = r.number(root, 'sampleRate', '', 48000, 8000, 192000);
  if (!Number.isInteger(sampleRate)) r.fail('sampleRate', `expected a whole number of hertz, got ${sampleRate}`);
  const velocities = r.choice(root, 'velocities', '', ['exact', 'estimated'] as const, 'exact');
  const snapshotRate = r.number(root, 'snapshotRate', '', 60, 1, 1000);
  let tuning: SceneScript['tuning'] = null;
  if (typeof root.tuning === 'string') tuning = root.tuning === '' ? (r.fail('tuning', 'expected a path or an object'), null) : { path: root.tuning };
  else if (root.tuning !== undefined && root.tuning !== null) {
    if (r.object(root.tuning, 'tuning')) tuning = { inline: root.tuning };
  }
  const sounds: Record<string, SoundSpec> = {};
  const so = r.object(root.sounds ?? {}, 'sounds');
  if (so)
    for (const [name, v] of Object.entries(so)) {
      if (!NAME.test(name)) r.fail(join('sounds', name), 'sound names match /^[A-Za-z][A-Za-z0-9_-]{0,63}$/');
      const s = parseSound(r, v, join('sounds', name));
      if (s) sounds[name] = s;
    }
  const sources: Record<string, SourceSpec> = {};
  const sr = r.object(root.sources ?? {}, 'sources');
  if (sr)
    for (const [name, v] of Object.entries(sr)) {
      const p = join('sources', name);
      if (!NAME.test(name)) r.fail(p, 'source names match /^[A-Za-z][A-Za-z0-9_-]{0,63}$/');
      const o = r.object(v, p);
      if (!o) continue;
      r.known(o, p, ['motion']);
      sources[name] = { motion: parseMotion(r, o.motion, join(p, 'motion')) };
    }
  let listener: ListenerSpec = { motion: { type: 'fixed', position: [0, 0, 0] }, forward: [0, 0, -1], up: [0, 1, 0] };
  if (root.listener !== undefined) {
    const o = r.object(root.listener, 'listener');
    if (o) {
      r.known(o, 'listener', ['motion', 'forward', 'up']);
      listener = {
        motion: o.motion === undefined ? listener.motion : parseMotion(r, o.motion, 'listener.motion'),
        forward: r.triple(o, 'forward', 'listener', [0, 0, -1]),
        up: r.triple(o, 'up', 'listener', [0, 1, 0]),
      };
    }
  }
  const timeScale: TimeScaleKey[] = [];
  if (root.timeScale !== undefined) {
    if (!Array.isArray(root.timeScale)) r.fail('timeScale', `expected an array of { time, target, rampSeconds, easing }, got ${describe(root.timeScale)}`);
    else
      root.timeScale.forEach((k, i) => {
        const p = join('timeScale', i);
        const o = r.object(k, p);
        if (!o) return;
        r.known(o, p, ['time', 'target', 'rampSeconds', 'easing']);
        const time = r.number(o, 'time', p, undefined, 0, 3600);
        if (timeScale.length > 0 && time < timeScale[timeScale.length - 1].time) r.fail(join(p, 'time'), 'time-scale keys must be in time order');
        timeScale.push({
          time,
          target: r.number(o, 'target', p, undefined, 0, 4),
          rampSeconds: r.number(o, 'rampSeconds', p, 0, 0, 60),
          easing: r.choice(o, 'easing', p, ['linear', 'smooth', 'exponential'] as const, 'smooth'),
        });
      });
  }
  const voices: VoiceSpec[] = [];
  if (!Array.isArray(root.voices)) r.fail('voices', `expected an array of voices, got ${describe(root.voices)}`);
  else
    root.voices.forEach((v, i) => {
      const p = join('voices', i);
      const o = r.object(v, p);
      if (!o) return;
      r.known(o, p, ['sound', 'source', 'group', 'loop', 'loopStartSeconds', 'loopEndSeconds', 'offsetSeconds', 'gain', 'ratio', 'priority', 'start', 'stop', 'fadeOutSeconds', 'pitchRange', 'gainRange']);
      const sound = r.string(o, 'sound', p);
      if (sound !== '' && !(sound in sounds)) r.fail(join(p, 'sound'), `no sound named "${sound}" in sounds`);
      const source = o.source === undefined || o.source === null ? null : r.string(o, 'source', p);
      if (source !== null && source !== '' && !(source in sources)) r.fail(join(p, 'source'), `no source named "${source}" in sources`);
      const group = o.group === undefined ? null : r.string(o, 'group', p);
      const start = r.number(o, 'start', p, 0, 0, 3600);
      const stop = r.optionalNumber(o, 'stop', p, 0, 3600);
      if (stop !== null && stop < start) r.fail(join(p, 'stop'), `stop (${stop}) is before start (${start})`);
      const loopStartSeconds = r.optionalNumber(o, 'loopStartSeconds', p, 0, 3600);
      const loopEndSeconds = r.optionalNumber(o, 'loopEndSeconds', p, 0, 3600);
      if (loopStartSeconds !== null && loopEndSeconds !== null && loopEndSeconds <= loopStartSeconds) r.fail(join(p, 'loopEndSeconds'), 'loop end must be after loop start');
      voices.push({
        sound,
        source,
        group,
        loop: r.bool(o, 'loop', p, false),
        loopStartSeconds,
        loopEndSeconds,
        offsetSeconds: r.number(o, 'offsetSeconds', p, 0, 0, 3600),
        gain: r.number(o, 'gain', p, 1, 0, 16),
        ratio: r.number(o, 'ratio', p, 1, 0, 4, true),
        priority: r.optionalNumber(o, 'priority', p, 0, 255),
        start,
        stop,
        fadeOutSeconds: r.number(o, 'fadeOutSeconds', p, 0.01, 0, 10),
        pitchRange: r.optionalRange(o, 'pitchRange', p, -2400, 2400),
        gainRange: r.optionalRange(o, 'gainRange', p, -60, 24),
      });
    });
  const seed = r.number(root, 'seed', '', 1, 0, 2 ** 32 - 1);
  if (!Number.isInteger(seed)) r.fail('seed', `expected an integer, got ${seed}`);
  if (r.issues.length > 0) throw new ScriptError(r.issues);
  return { version: version as 1, duration, sampleRate, velocities, snapshotRate, tuning, sounds, sources, listener, timeScale, voices, seed };
}
