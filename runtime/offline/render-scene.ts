// Node entry of the offline renderer: reads a script's WAV files and tuning file, then renders it.
import { readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { parseTuning, defaultTuning, TuningError, type Tuning } from '../../src/tuning';
import { parseSceneScript } from './parse-scene-script';
import { ScriptError, type ScriptIssue } from './script-error';
import type { SceneScript } from './scene-types';
import { generateSound, type SoundBuffer } from './scene-sounds';
import { readWav, WavError } from './wav';
import { renderLoadedScene, type SceneRenderOptions, type SceneRenderResult } from './scene-renderer';

/** Options of renderScene: the render options plus where relative paths in the script start. */
export interface RenderSceneOptions extends SceneRenderOptions {
  /** Directory that relative WAV and tuning paths are resolved against (default: the current directory). */
  baseDir?: string;
}

/** A script with its sounds generated or decoded and its tuning parsed. */
export interface LoadedScene {
  script: SceneScript;
  sounds: Record<string, SoundBuffer>;
  tuning: Tuning;
  /** Samples of the WAV sounds clamped to ±WAV_SAMPLE_BOUND or replaced (non-finite) when read. */
  inputClamped?: number;
}

/** Reads and parses a scene script file; relative paths inside it resolve against its directory. Throws ScriptError. */
export function loadSceneFile(path: string, sampleRate?: number): LoadedScene {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (e) {
    throw new ScriptError([{ path: '', message: `cannot read ${path}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}` }]);
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    throw new ScriptError([{ path: '', message: `${path} is not valid JSON: ${(e as Error).message}` }]);
  }
  return loadScene(json, { baseDir: dirname(resolve(path)), sampleRate });
}

/** Parses a script (or takes a parsed one), generates its sounds, reads its WAV files and tuning; throws ScriptError naming the JSON path. */
export function loadScene(script: SceneScript | unknown, options: { baseDir?: string; sampleRate?: number } = {}): LoadedScene {
  const s = isParsed(script) ? script : parseSceneScript(script);
  const base = options.baseDir ?? process.cwd();
  const rate = options.sampleRate ?? s.sampleRate;
  const issues: ScriptIssue[] = [];
  const sounds: Record<string, SoundBuffer> = {};
  let inputClamped = 0;
  for (const [name, spec] of Object.entries(s.sounds)) {
    if (spec.type !== 'file') {
      sounds[name] = generateSound(spec, rate);
      continue;
    }
    const file = resolve(base, spec.path);
    try {
      const wav = readWav(readFileSync(file));
      inputClamped += wav.clamped ?? 0;
      sounds[name] = { channels: wav.channels.slice(0, 2), sampleRate: wav.sampleRate, frequency: null };
      if (wav.channels[0].length === 0) issues.push({ path: `sounds.${name}.path`, message: `${file} holds no samples` });
    } catch (e) {
      const why = e instanceof WavError ? e.message : `cannot read ${file}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`;
      issues.push({ path: `sounds.${name}.path`, message: why });
    }
  }
  let tuning: Tuning = defaultTuning;
  if (s.tuning !== null) {
    let json: unknown;
    let ok = true;
    if ('path' in s.tuning) {
      const file = resolve(base, s.tuning.path);
      try {
        json = readFileSync(file, 'utf8'); // the text: parseTuning checks its size and repeated keys before using it
      } catch (e) {
        ok = false;
        issues.push({ path: 'tuning', message: `cannot read the tuning file ${file}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}` });
      }
    } else json = s.tuning.inline;
    if (ok) {
      try {
        tuning = parseTuning(json);
      } catch (e) {
        if (!(e instanceof TuningError)) throw e;
        for (const i of e.issues) issues.push({ path: i.path === '' ? 'tuning' : `tuning.${i.path}`, message: i.message });
      }
    }
  }
  if (issues.length > 0) throw new ScriptError(issues);
  return { script: s, sounds, tuning, inputClamped };
}

/** Renders a scene script (parsed or raw JSON) offline with the engine: stereo Float32Arrays plus a summary. */
export function renderScene(script: SceneScript | unknown, options: RenderSceneOptions = {}): SceneRenderResult {
  const loaded = loadScene(script, options);
  return renderLoadedScene(loaded.script, loaded.sounds, loaded.tuning, options);
}

function isParsed(x: unknown): x is SceneScript {
  const o = x as SceneScript;
  if (o === null || typeof o !== 'object' || o.version !== 1 || !Array.isArray(o.voices) || o.listener === undefined || typeof o.listener.motion !== 'object' || typeof o.velocities !== 'string') return false;
  // A raw document may spell out every field too; only a parsed one holds its tuning as null, { inline } or { path }.
  const t = o.tuning as unknown;
  return t === null || (typeof t === 'object' && Object.keys(t as object).length === 1 && ('inline' in (t as object) || 'path' in (t as object)));
}
