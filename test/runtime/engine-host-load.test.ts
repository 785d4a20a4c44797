// Render load measured by the worklet host: time in process() over audio time, with an injected clock (no wall clock
// in tests). Chromium's AudioWorkletGlobalScope has no `performance`, so the processor falls back to Date.now and its
// 1 ms steps; the running average must then still find the true load.
import { describe, expect, it } from 'vitest';
import { EngineHost, type RenderClock } from '../../runtime/worklet/engine-host';
import type { RenderLoad, Report, StatsReport } from '../../runtime/protocol';
import { defaultTuning } from '../../src/tuning/index';

const SAMPLE_RATE = 48000;
const BLOCK_MS = (1000 * 128) / SAMPLE_RATE; // 8/3 ms, one render quantum

function host(clock?: RenderClock) {
  const reports: Report[] = [];
  const h = new EngineHost({
    sampleRate: SAMPLE_RATE,
    startContextTime: 0,
    processorOptions: { capacity: 4, maxSounds: 8, tuning: defaultTuning, statsIntervalSeconds: 0.25 },
    post: (r) => reports.push(r),
    clock,
  });
  const sine = new Float32Array(4800).map((_, i) => 0.5 * Math.sin((2 * Math.PI * 440 * i) / SAMPLE_RATE));
  h.handle({ type: 'add-sound', sound: 1, channels: [sine], sampleRate: SAMPLE_RATE });
  h.handle({ type: 'play', voice: 1, sound: 1, options: { loop: true } });
  const out = [new Float32Array(128), new Float32Array(128)];
  const loads = () => reports.filter((r): r is StatsReport => r.type === 'stats').map((r) => r.load ?? null);
  return { h, out, loads };
}

/** Clock reads taken by host()'s two setup messages (each handle() reads the clock twice); they read zero time. */
const SETUP_CALLS = 4;

/** A clock that reads `start` on the first call of each block and `start + busy` on the second, optionally floored (after SETUP_CALLS reads of starts[0]). */
function scriptedClock(starts: number[], busyMs: number, step: 'exact' | 'whole-ms'): RenderClock {
  let call = -SETUP_CALLS;
  return {
    name: step === 'exact' ? 'performance.now' : 'Date.now',
    now: () => {
      if (call < 0) {
        call++;
        return starts[0];
      }
      const block = call >> 1;
      const t = starts[block] + (call & 1 ? busyMs : 0);
      call++;
      return step === 'exact' ? t : Math.floor(t);
    },
  };
}

/** Seeded LCG in [0, 1) (Numerical Recipes constants, common practice). */
function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(1664525, s) + 1013904223) >>> 0) / 2 ** 32);
}

describe('EngineHost render load', () => {
  it('reports null without a clock', () => {
    const { h, out, loads } = host();
    for (let b = 0; b < 200; b++) h.process(out);
    expect(loads().length).toBeGreaterThan(0);
    expect(loads().every((l) => l === null)).toBe(true);
  });

  it('reports time in process ÷ audio time with an exact clock, and names the clock', () => {
    const blocks = 400;
    const starts = Array.from({ length: blocks }, (_, i) => 1000 + i * BLOCK_MS);
    const { h, out, loads } = host(scriptedClock(starts, 0.5, 'exact'));
    for (let b = 0; b < blocks; b++) h.process(out);
    const last = loads().at(-1) as RenderLoad;
    // 0.5 ms of every 8/3 ms block: 0.1875 exactly; the running average of a constant is that constant.
    expect(last.fraction).toBeCloseTo(0.5 / BLOCK_MS, 9);
    expect(last.clock).toBe('performance.now');
    expect(last.averageSeconds).toBe(1);
  });

  it.each([0.1, 0.4, 1.2])('finds a true %f ms per block within 15 % from a clock in whole milliseconds (seeded jitter)', (busyMs) => {
    // Blocks come in bursts of 4 (a 512-frame device buffer), bursts every 32/3 ms with ±1 ms scheduling jitter, so
    // block starts fall at every phase of the millisecond; each floored reading is then unbiased on average.
    const random = lcg(0x10ad + Math.round(busyMs * 10));
    const bursts = 1200;
    const starts: number[] = [];
    for (let b = 0; b < bursts; b++) {
      const burstStart = 5000 + b * 4 * BLOCK_MS + (random() - 0.5) * 2;
      for (let k = 0; k < 4; k++) starts.push(burstStart + k * (busyMs + 0.01));
    }
    const { h, out, loads } = host(scriptedClock(starts, busyMs, 'whole-ms'));
    for (let b = 0; b < starts.length; b++) h.process(out);
    const last = loads().at(-1) as RenderLoad;
    const truth = busyMs / BLOCK_MS;
    expect(last.clock).toBe('Date.now');
    expect(Math.abs(last.fraction / truth - 1)).toBeLessThan(0.15);
  });

  it('ignores a clock that steps backwards instead of reporting a negative load', () => {
    const blocks = 200;
    const starts = Array.from({ length: blocks }, (_, i) => 1000 - i * BLOCK_MS);
    const { h, out, loads } = host(scriptedClock(starts, -0.5, 'exact'));
    for (let b = 0; b < blocks; b++) h.process(out);
    expect((loads().at(-1) as RenderLoad).fraction).toBe(0);
  });

  it('counts time spent handling messages on the audio thread, and reports the longest single call', () => {
    // Each block: process() takes 0.5 ms, then one message takes 2 ms: (0.5 + 2) / (8/3) of the audio time.
    const readings: number[] = [0, 0, 0, 0]; // host()'s setup messages
    for (let b = 0; b < 400; b++) {
      const start = 1000 + b * BLOCK_MS;
      readings.push(start, start + 0.5, start + 0.5, start + 2.5);
    }
    let k = 0;
    const { h, out, loads } = host({ name: 'performance.now', now: () => readings[k++] });
    for (let b = 0; b < 400; b++) {
      h.process(out);
      h.handle({ type: 'set-voice', voice: 1, gain: 0.5 });
    }
    const last = loads().at(-1) as RenderLoad;
    expect(last.fraction).toBeCloseTo(2.5 / BLOCK_MS, 6);
    expect(last.peakMs).toBeCloseTo(2, 9);
  });
});
