// Page side of the Chromium engine timing: renders the bench scene through the worklet in an OfflineAudioContext.
import { createRalenti } from '../runtime/index';
import { BENCH_RAMP, BENCH_RATE, benchPlays, benchSounds } from './browser-engine-scene';

async function renderBench(voices: number, seconds: number): Promise<{ ms: number; active: number }> {
  const ctx = new OfflineAudioContext(2, Math.round(seconds * BENCH_RATE), BENCH_RATE);
  const r = await createRalenti(ctx, { workletUrl: '/ralenti-processor.js', capacity: Math.max(1, voices), statsIntervalSeconds: 0.05 });
  r.connect(ctx.destination);
  const sounds = benchSounds().map((s) => r.load(s));
  for (const p of benchPlays(voices)) r.play(sounds[p.sound], p.options);
  r.setTimeScale(BENCH_RAMP.target, { ramp: seconds, easing: BENCH_RAMP.easing });
  await r.flush();
  const t0 = performance.now();
  await ctx.startRendering();
  const ms = performance.now() - t0;
  await r.flush();
  const active = r.stats.activeVoices;
  r.dispose();
  return { ms, active };
}

Object.assign(globalThis, { renderBench });
