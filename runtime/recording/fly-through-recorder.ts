// Records a fly-through in a page — the listener path, the source paths and the time-scale requests, with timestamps —
// and writes it as a scene script (runtime/offline's format): cubic (Catmull–Rom) keyframes per path, time-scale keys,
// voices. Cubic, because frames sample smooth motion: a linear path would step its velocity at every frame.
import type { Easing, MetersPerSecond, Seconds, Vec3Like } from '../../src/index';
import { SCENE_SCRIPT_VERSION } from '../offline/parse-scene-script';

/** Options of FlyThroughRecorder. */
export interface FlyThroughRecorderOptions {
  /** Most keys per second and path, 1…240 (default 60); frames closer than 0.75 / keyRate to the last key are skipped. */
  keyRate?: number;
  /** Recording stops taking frames after this many seconds, 1…3600 (default 600). */
  maxSeconds?: Seconds;
  /** A move faster than this between two frames is a jump (a teleport, e.g. a wrapping path), written as a cut key (default 400). */
  teleportSpeed?: MetersPerSecond;
}

/** Frozen defaults of FlyThroughRecorderOptions. */
export const flyThroughRecorderDefaults = Object.freeze({ keyRate: 60, maxSeconds: 600, teleportSpeed: 400 });

/** One voice to write into the script: a sound of `ScriptContent.sounds` playing (looped) on a recorded source or none. */
export interface RecordedVoice {
  sound: string;
  source: string | null;
  group: string;
  gain: number;
}

/** What the page adds to the recorded motion to make a whole script. */
export interface ScriptContent {
  /** Free-text title of the script. */
  title?: string;
  /** The running tuning as a plain JSON object (written inline). */
  tuning: unknown;
  /** Scene-script sound specs by name (tones and hums equivalent to the page's sounds). */
  sounds: Readonly<Record<string, unknown>>;
  voices: readonly RecordedVoice[];
  /** Output rate of the script in Hz (default 48000). */
  sampleRate?: number;
}

type Key = { time: number; position: [number, number, number]; cut?: true };

class PathRecord {
  readonly keys: Key[] = [];
  private last: Key | null = null;
  private lastStored = true;

  add(time: number, p: Vec3Like, minSpacing: number, teleportSpeed: number): void {
    const key: Key = { time, position: [p.x, p.y, p.z] };
    const prev = this.last;
    this.last = key;
    if (prev === null) {
      this.keys.push(key);
      this.lastStored = true;
      return;
    }
    const dt = time - prev.time;
    const jump = Math.hypot(p.x - prev.position[0], p.y - prev.position[1], p.z - prev.position[2]);
    if (jump > teleportSpeed * dt) {
      if (!this.lastStored) this.keys.push(prev);
      key.cut = true;
      this.keys.push(key);
      this.lastStored = true;
      return;
    }
    const since = time - this.keys[this.keys.length - 1].time;
    this.lastStored = since >= minSpacing;
    if (this.lastStored) this.keys.push(key);
  }

  finish(): void {
    if (this.last && !this.lastStored) this.keys.push(this.last);
    this.lastStored = true;
  }
}

/** Records one fly-through at a time; feed it one frame per animation frame while recording. */
export class FlyThroughRecorder {
  private readonly keyRate: number;
  private readonly maxSeconds: number;
  private readonly teleportSpeed: number;
  private startTime = 0;
  private lastTime = 0;
  private active = false;
  private listener = new PathRecord();
  private sources = new Map<string, PathRecord>();
  private forward: [number, number, number] = [0, 0, -1];
  private up: [number, number, number] = [0, 1, 0];
  private timeKeys: { time: number; target: number; rampSeconds: number; easing: Easing }[] = [];
  private frames = 0;
  private startedSlow = false;

  /** Validates the options (RangeError naming the field). */
  constructor(options: FlyThroughRecorderOptions = {}) {
    this.keyRate = checked('keyRate', options.keyRate ?? flyThroughRecorderDefaults.keyRate, 1, 240);
    this.maxSeconds = checked('maxSeconds', options.maxSeconds ?? flyThroughRecorderDefaults.maxSeconds, 1, 3600);
    this.teleportSpeed = checked('teleportSpeed', options.teleportSpeed ?? flyThroughRecorderDefaults.teleportSpeed, 1, 1e6);
  }

  /** Whether a recording is running. */
  get recording(): boolean {
    return this.active;
  }

  /** Seconds recorded so far (of the running or the last recording). */
  get seconds(): Seconds {
    return this.lastTime - this.startTime;
  }

  /** Page time (s) that script time 0 of the running or last recording stands for (its first frame's timestamp). */
  get startPageTime(): Seconds {
    return this.startTime;
  }

  /** Frames taken so far (of the running or the last recording). */
  get frameCount(): number {
    return this.frames;
  }

  /**
   * Starts a new recording at page time `time` (s), discarding the last one. The listener's orientation is taken
   * here (scene scripts hold one fixed orientation); a time scale other than 1 becomes a key at time 0.
   */
  start(time: Seconds, orientation: { forward: Vec3Like; up: Vec3Like }, timeScale: number): void {
    this.active = true;
    this.startTime = time;
    this.lastTime = time;
    this.frames = 0;
    this.listener = new PathRecord();
    this.sources = new Map();
    this.forward = [round(orientation.forward.x, 6), round(orientation.forward.y, 6), round(orientation.forward.z, 6)];
    this.up = [round(orientation.up.x, 6), round(orientation.up.y, 6), round(orientation.up.z, 6)];
    this.startedSlow = timeScale !== 1;
    this.timeKeys = this.startedSlow ? [{ time: 0, target: timeScale, rampSeconds: 0, easing: 'linear' }] : [];
  }

  /** Takes one frame at page time `time` (s, increasing): listener and source positions in metres. */
  frame(time: Seconds, listener: Vec3Like, sources: Readonly<Record<string, Vec3Like>>): void {
    if (!this.active || !(time > this.lastTime || this.frames === 0)) return;
    if (this.frames === 0 && time < this.startTime) {
      // An animation frame's timestamp is its start, which can precede the click that started the recording: the
      // recording then starts at that frame (time-scale keys already noted move with it).
      const shift = this.startTime - time;
      this.timeKeys.forEach((k, i) => {
        if (i > 0 || !this.startedSlow) k.time = round(k.time + shift, 5);
      });
      this.startTime = time;
    }
    const t = round(time - this.startTime, 5);
    if (t > this.maxSeconds || !finite(listener) || !Object.values(sources).every(finite)) return;
    const spacing = 0.75 / this.keyRate;
    this.listener.add(t, rounded(listener), spacing, this.teleportSpeed);
    for (const [name, p] of Object.entries(sources)) {
      let path = this.sources.get(name);
      if (!path) this.sources.set(name, (path = new PathRecord()));
      path.add(t, rounded(p), spacing, this.teleportSpeed);
    }
    this.lastTime = time;
    this.frames++;
  }

  /** Notes a time-scale request made at page time `time` (as passed to the runtime's setTimeScale). */
  timeScale(time: Seconds, target: number, rampSeconds: Seconds, easing: Easing): void {
    if (!this.active) return;
    const t = Math.max(0, round(time - this.startTime, 5));
    const last = this.timeKeys[this.timeKeys.length - 1];
    this.timeKeys.push({ time: last ? Math.max(last.time, t) : t, target, rampSeconds, easing });
  }

  /** Ends the recording at page time `time`; the last frame of every path is kept. */
  stop(time: Seconds): void {
    if (!this.active) return;
    this.active = false;
    this.lastTime = Math.max(this.lastTime, Math.min(time, this.startTime + this.maxSeconds));
    this.listener.finish();
    for (const p of this.sources.values()) p.finish();
  }

  /** The last recording as a scene-script document (plain JSON), with `content` supplying sounds, voices and tuning. */
  toScript(content: ScriptContent): Record<string, unknown> {
    if (this.frames < 2) throw new Error('nothing recorded yet: record at least two frames');
    const duration = round(Math.max(this.seconds, 0.01), 5);
    const sources: Record<string, unknown> = {};
    for (const [name, path] of this.sources) sources[name] = { motion: motionOf(path.keys) };
    const recorded = new Set(this.sources.keys());
    const voices = content.voices
      .filter((v) => v.source === null || recorded.has(v.source))
      .map((v) => ({ sound: v.sound, ...(v.source === null ? {} : { source: v.source }), group: v.group, loop: true, gain: v.gain }));
    return {
      version: SCENE_SCRIPT_VERSION,
      title: content.title ?? 'A fly-through recorded in the page',
      duration,
      sampleRate: content.sampleRate ?? 48000,
      velocities: 'exact',
      snapshotRate: 60,
      tuning: content.tuning,
      sounds: content.sounds,
      sources,
      listener: { motion: motionOf(this.listener.keys), forward: this.forward, up: this.up },
      timeScale: this.timeKeys.filter((k) => k.time < duration),
      voices,
    };
  }
}

function motionOf(keys: readonly Key[]): unknown {
  const [first] = keys;
  const still = keys.every((k) => k.position.every((c, i) => c === first.position[i]));
  return still ? { type: 'fixed', position: first.position } : { type: 'keyframes', interpolation: 'cubic', keys };
}

function finite(p: Vec3Like): boolean {
  return Number.isFinite(p.x) && Number.isFinite(p.y) && Number.isFinite(p.z);
}

function rounded(p: Vec3Like): Vec3Like {
  return { x: round(p.x, 4), y: round(p.y, 4), z: round(p.z, 4) };
}

function round(v: number, digits: number): number {
  const k = 10 ** digits;
  return Math.round(v * k) / k;
}

function checked(name: string, v: number, min: number, max: number): number {
  if (!(v >= min && v <= max)) throw new RangeError(`FlyThroughRecorder: ${name} must be in ${min}…${max}, got ${v}`);
  return v;
}

/** Scene-script JSON as text: two-space indents, number arrays and keyframe keys on one line each. */
export function formatSceneScript(json: unknown): string {
  return JSON.stringify(json, null, 2)
    .replace(/\[\s*(-?[\d.eE+-]+(?:,\s*-?[\d.eE+-]+)*)\s*\]/g, (_m, inner: string) => `[${inner.replace(/,\s*/g, ', ')}]`)
    .replace(/\{\s*("time": [^{}[\]]*?,\s*"position": \[[^\]]*\](?:,\s*"cut": true)?)\s*\}/g, (_m, inner: string) => `{ ${inner.replace(/\s*\n\s*/g, ' ')} }`);
}
