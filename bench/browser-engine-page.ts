// Page side of the Chromium engine timing: renders the bench scene through the worklet in an OfflineAudioContext.
import { createRalenti, type RalentiPlayOptions } from '../runtime/index';
import type { PlayOptions } from '../src/index';
import { BENCH_RAMP, BENCH_RATE, MOVING_STEP_FRAMES, benchPlays, benchSounds, movingPlays, movingPosition } from './browser-engine-scene';

/** The runtime's form of the scene's engine play options (gain in dB at this API). */
function runtimeOptions(o: PlayOptions): RalentiPlayOptions {
  return { loop: o.loop, group: o.group, ratio: o.ratio, fadeInSeconds: o.fadeInSeconds, gainDb: 20 * Math.log10(o.gain ?? 1) };
}

/** A figure of a rendering: wall time and the worklet thread's processor time of its timed part (ms; NaN when unread). */
export interface Timing {
  ms: number;
  cpuMs: number;
  active: number;
}

/**
 * Processor time (ms) the offline worklet threads have run so far, read by the bench from the operating system
 * (`benchWorkletCpuMs`, exposed by the bench): call it only while the context is suspended or done, so that the
 * round trip it takes is not rendering time. NaN when the bench does not expose it.
 */
async function workletCpuMs(): Promise<number> {
  const read = (globalThis as unknown as { benchWorkletCpuMs?: () => Promise<number> }).benchWorkletCpuMs;
  return read === undefined ? NaN : read();
}

/**
 * Renders `warmSeconds` + `seconds` and times only the last `seconds`: every OfflineAudioContext starts a new worklet
 * scope (module compiled afresh, JIT cold), so the warm-up keeps that start-up out of the engine's figure.
 */
async function renderBench(voices: number, seconds: number, warmSeconds: number): Promise<Timing> {
  const total = warmSeconds + seconds;
  const ctx = new OfflineAudioContext(2, Math.round(total * BENCH_RATE), BENCH_RATE);
  const r = await createRalenti(ctx, { workletUrl: '/ralenti-processor.js', capacity: Math.max(1, voices), statsIntervalSeconds: 0.05 });
  r.connect(ctx.destination);
  const sounds = benchSounds().map((s) => r.load(s));
  for (const p of benchPlays(voices)) r.play(sounds[p.sound], runtimeOptions(p.options));
  r.setTimeScale(BENCH_RAMP.target, { ramp: total, easing: BENCH_RAMP.easing });
  await r.flush();
  let cpu0 = await workletCpuMs();
  let t0 = performance.now();
  // The suspend time is rounded to a render quantum; the timed part is what follows it.
  const warmFrames = Math.round((warmSeconds * BENCH_RATE) / 128) * 128;
  if (warmFrames > 0) {
    void ctx.suspend(warmFrames / BENCH_RATE).then(async () => {
      cpu0 = await workletCpuMs();
      t0 = performance.now();
      void ctx.resume();
    });
  }
  await ctx.startRendering();
  const ms = performance.now() - t0;
  const cpuMs = (await workletCpuMs()) - cpu0;
  await r.flush();
  const active = r.stats.activeVoices;
  r.dispose();
  return { ms, cpuMs, active };
}

/**
 * The moving scene (`voices` stereo voices on voices/2 sources circling the listener, default tuning: propagation on,
 * time scale gliding): positions are sent every MOVING_STEP_FRAMES at a suspension of the context; only rendering
 * after `warmSeconds` is timed, from each resume to the next suspension (the main thread's part is left out): in wall
 * time, and in the worklet thread's processor time read at each suspension after the positions have been handed over
 * (so neither the waits for a core nor the handling of the position messages count, only the rendering).
 */
async function renderMoving(voices: number, seconds: number, warmSeconds: number): Promise<Timing> {
  const total = warmSeconds + seconds;
  const frames = Math.round((total * BENCH_RATE) / MOVING_STEP_FRAMES) * MOVING_STEP_FRAMES;
  const ctx = new OfflineAudioContext(2, frames, BENCH_RATE);
  const r = await createRalenti(ctx, { workletUrl: '/ralenti-processor.js', capacity: voices, statsIntervalSeconds: 0.05 });
  r.connect(ctx.destination);
  const sounds = benchSounds().map((s) => r.load(s));
  const sources = Array.from({ length: voices / 2 }, () => r.createSource());
  r.setListener({ position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } });
  const place = (frame: number) => {
    const t = frame / BENCH_RATE;
    sources.forEach((s, k) => {
      const p = movingPosition(k, t);
      s.setPosition(p.x, p.y, p.z);
    });
    r.update(t);
  };
  place(0);
  for (const p of movingPlays(voices)) r.play(sounds[p.sound], { ...runtimeOptions(p.options), source: sources[p.source] });
  r.setTimeScale(BENCH_RAMP.target, { ramp: total, easing: BENCH_RAMP.easing });
  await r.flush();
  const warmFrames = Math.round((warmSeconds * BENCH_RATE) / MOVING_STEP_FRAMES) * MOVING_STEP_FRAMES;
  let ms = 0;
  let cpuMs = 0;
  let resumed = performance.now();
  let cpuResumed = 0;
  const steps: Promise<void>[] = [];
  for (let f = MOVING_STEP_FRAMES; f < frames; f += MOVING_STEP_FRAMES) {
    steps.push(
      ctx.suspend(f / BENCH_RATE).then(async () => {
        if (f > warmFrames) {
          ms += performance.now() - resumed;
          cpuMs += (await workletCpuMs()) - cpuResumed;
        }
        place(f);
        await r.flush();
        if (f >= warmFrames) cpuResumed = await workletCpuMs();
        resumed = performance.now();
        await ctx.resume();
      }),
    );
  }
  await ctx.startRendering();
  ms += performance.now() - resumed;
  cpuMs += (await workletCpuMs()) - cpuResumed;
  await Promise.all(steps);
  await r.flush();
  const active = r.stats.activeVoices;
  r.dispose();
  return { ms, cpuMs, active };
}

Object.assign(globalThis, { renderBench, renderMoving });
