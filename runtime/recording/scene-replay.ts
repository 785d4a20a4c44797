// Replays a scene script in a page: listener and source paths evaluated at a replay clock that the page advances
// each frame, and the script's time-scale keys handed out as the clock passes them.
import type { Seconds, Vec3Like } from '../../src/index';
import { parseSceneScript } from '../offline/parse-scene-script';
import { evaluateMotion } from '../offline/scene-motion';
import { ScriptError, type ScriptIssue } from '../offline/script-error';
import type { SceneScript, TimeScaleKey } from '../offline/scene-types';

/** Position (m) and velocity (m/s, the path's exact derivative) of a replayed point. */
export interface ReplayPoint {
  readonly position: Vec3Like;
  readonly velocity: Vec3Like;
}

/** Result of reading a scene script from text: the parsed script, or its problems by JSON path. */
export type SceneScriptReadResult = { ok: true; script: SceneScript } | { ok: false; problems: ScriptIssue[] };

/** Parses scene-script text (JSON, then the script format); never throws. */
export function readSceneScriptText(text: string): SceneScriptReadResult {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    return { ok: false, problems: [{ path: '', message: `not valid JSON: ${(e as Error).message}` }] };
  }
  try {
    return { ok: true, script: parseSceneScript(json) };
  } catch (e) {
    if (e instanceof ScriptError) return { ok: false, problems: [...e.issues] };
    return { ok: false, problems: [{ path: '', message: String((e as Error)?.message ?? e) }] };
  }
}

/** One replay of a script from time 0 to its duration. */
export class SceneReplay {
  /** The script being replayed. */
  readonly script: SceneScript;
  /** The listener at the current replay time. */
  readonly listener: ReplayPoint = { position: { x: 0, y: 0, z: 0 }, velocity: { x: 0, y: 0, z: 0 } };
  private readonly points = new Map<string, ReplayPoint>();
  private clock = 0;
  private nextKey = 0;

  /** Starts at replay time 0; `script` as parseSceneScript returns it. */
  constructor(options: { script: SceneScript }) {
    this.script = options.script;
    for (const name of Object.keys(this.script.sources)) this.points.set(name, { position: { x: 0, y: 0, z: 0 }, velocity: { x: 0, y: 0, z: 0 } });
    this.evaluate();
  }

  /** Replay time in seconds, 0…duration. */
  get time(): Seconds {
    return this.clock;
  }

  /** Whether the replay has reached the script's duration. */
  get finished(): boolean {
    return this.clock >= this.script.duration;
  }

  /** The named source at the current replay time, or null when the script has no such source. */
  source(name: string): ReplayPoint | null {
    return this.points.get(name) ?? null;
  }

  /**
   * Advances the clock by `dt` seconds (≥ 0, stopping at the duration), updates the listener and sources, and
   * returns the time-scale keys whose time was reached (in order; the first call also returns keys at time 0).
   */
  advance(dt: Seconds): TimeScaleKey[] {
    this.clock = Math.min(this.script.duration, this.clock + Math.max(0, Number.isFinite(dt) ? dt : 0));
    this.evaluate();
    const keys: TimeScaleKey[] = [];
    const all = this.script.timeScale;
    while (this.nextKey < all.length && all[this.nextKey].time <= this.clock) keys.push(all[this.nextKey++]);
    return keys;
  }

  private evaluate(): void {
    evaluateMotion(this.script.listener.motion, this.clock, this.listener.position, this.listener.velocity);
    for (const [name, p] of this.points) evaluateMotion(this.script.sources[name].motion, this.clock, p.position, p.velocity);
  }
}
