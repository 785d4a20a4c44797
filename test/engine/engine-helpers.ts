// Shared helpers of the engine suites: signals, a render loop and measurements.
import { Engine } from '../../src/engine';
import type { EngineOptions, PlayOptions, Tuning } from '../../src/index';
import { parseTuning, defaultTuning, serializeTuning } from '../../src/tuning';

/** A sine of `hz` at `rate`, amplitude `amp`, `seconds` long. */
export function sine(hz: number, rate: number, seconds: number, amp = 0.4): Float32Array {
  const n = Math.round(seconds * rate);
  const x = new Float32Array(n);
  for (let i = 0; i < n; i++) x[i] = amp * Math.sin((2 * Math.PI * hz * i) / rate);
  return x;
}

/** Renders `seconds` in blocks of `block` frames; `each` runs before every block with the block's start time. */
export function renderFor(engine: Engine, seconds: number, block = 128, each?: (time: number) => void): [Float32Array, Float32Array] {
  const n = Math.round(seconds * engine.sampleRate);
  const left = new Float32Array(n);
  const right = new Float32Array(n);
  const l = new Float32Array(block);
  const r = new Float32Array(block);
  for (let o = 0; o < n; o += block) {
    each?.(engine.time);
    const m = Math.min(block, n - o);
    engine.render([l, r], m);
    left.set(l.subarray(0, m), o);
    right.set(r.subarray(0, m), o);
  }
  return [left, right];
}

/** A tuning derived from the default one with `patch` applied to its JSON form. */
export function tuningWith(patch: (t: Record<string, any>) => void): Tuning {
  const json = JSON.parse(serializeTuning(defaultTuning));
  patch(json);
  return parseTuning(json);
}

/** A fresh engine at 48 kHz with the given options. */
export function engineAt(options: Partial<EngineOptions> = {}): Engine {
  return new Engine({ sampleRate: 48000, ...options });
}

/** Plays one sound on a fresh engine and returns the engine and handle. */
export function playOne(channels: Float32Array[], rate: number, play: PlayOptions, options: Partial<EngineOptions> = {}): { engine: Engine; voice: number } {
  const engine = engineAt(options);
  const sound = engine.addSound(channels, rate);
  const voice = engine.play(sound, play);
  return { engine, voice };
}

/** Largest sample-to-sample step of a signal. */
export function maxStep(x: Float32Array, from = 1, to = x.length): number {
  let m = 0;
  for (let i = Math.max(1, from); i < to; i++) m = Math.max(m, Math.abs(x[i] - x[i - 1]));
  return m;
}
