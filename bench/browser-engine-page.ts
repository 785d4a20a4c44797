// Page side of the Chromium engine timing: renders the bench scene through the worklet in an OfflineAudioContext.
import { createRalenti } from '../runtime/index';
import { BENCH_RAMP, BENCH_RATE, benchPlays, benchSounds } from './browser-engine-scene';

/**
 * Renders `warmSeconds` + `seconds` and times only the last `seconds`: every OfflineAudioContext starts a new worklet
 * scope (module compiled afresh, JIT cold), so the warm-up keeps that start-up out of the engine's figure.
 */
async function renderBench(voices: number, seconds: number, warmSeconds: number): Promise<{ ms: number; active: number }> {
  const total = warmSeconds + seconds;
  const ctx = new OfflineAudioContext(2, Math.round(total * BENCH_RATE), BENCH_RATE);
  const r = await createRalenti(ctx, { workletUrl: '/ralenti-processor.js', capacity: Math.max(1, voices), statsIntervalSeconds: 0.05 });
  r.connect(ctx.destination);
  const sounds = benchSounds().map((s) => r.load(s));
  for (const p of benchPlays(voices)) r.play(sounds[p.sound], p.options);
  r.setTimeScale(BENCH_RAMP.target, { ramp: total, easing: BENCH_RAMP.easing });
  await r.flush();
  let t0 = performance.now();
  // The suspend time is rounded to a render quantum; the timed part is what follows it.
  const warmFrames = Math.round((warmSeconds * BENCH_RATE) / 128) * 128;
  if (warmFrames > 0) {
    void ctx.suspend(warmFrames / BENCH_RATE).then(() => {
      t0 = performance.now();
      void ctx.resume();
    });
  }
  await ctx.startRendering();
  const ms = performance.now() - t0;
  await r.flush();
  const active = r.stats.activeVoices;
  r.dispose();
  return { ms, active };
}

Object.assign(globalThis, { renderBench });
