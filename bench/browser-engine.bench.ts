// Chromium timing of the engine bench scene: the bundled worklet in an OfflineAudioContext, against the same
// scene rendered by the engine in Node in the same run, as fractions of real time (one core).
import { readFileSync, readdirSync } from 'node:fs';
import { Engine } from '../src/engine/index';
import { workletSourceText } from '../scripts/build-worklet.mjs';
import type { Timing } from './browser-engine-page';
import { browserSuiteMode, bundleForBrowser, openPage } from '../test/browser/browser-harness';
import { BENCH_RAMP, BENCH_RATE, MOVING_STEP_FRAMES, MOVING_VOICES, benchPlays, benchSounds, movingPlays, movingPosition } from './browser-engine-scene';

const SECONDS = 1;
/** Rendered before the timed part in the same context (and engine): worklet start-up, module compile and JIT warm-up. */
const WARM_SECONDS = 0.25;
/** Runs per row; the fastest counts (the machine is shared, so the minimum is the least disturbed). */
const REPEATS = 2;
const VOICES = [0, 32, 64, 128, 256];
/** Warm-up of the moving scene: one second, so that the farthest sources' sound (265 m away) has arrived and every voice sounds. */
const MOVING_WARM_SECONDS = 1;

function nodeMs(voices: number, seconds: number, warmSeconds: number): number {
  const engine = new Engine({ sampleRate: BENCH_RATE, capacity: Math.max(1, voices) });
  const ids = benchSounds().map((s) => engine.addSound(s.channels, s.sampleRate));
  for (const p of benchPlays(voices)) engine.play(ids[p.sound], p.options);
  engine.setTimeScale({ target: BENCH_RAMP.target, rampSeconds: warmSeconds + seconds, easing: BENCH_RAMP.easing, startTime: 0 });
  const l = new Float32Array(128);
  const r = new Float32Array(128);
  const warm = Math.round((warmSeconds * BENCH_RATE) / 128);
  for (let b = 0; b < warm; b++) engine.render([l, r], 128);
  const blocks = Math.round((seconds * BENCH_RATE) / 128);
  const t0 = performance.now();
  for (let b = 0; b < blocks; b++) engine.render([l, r], 128);
  return performance.now() - t0;
}

/** Thread name (as the kernel truncates it to 15 characters) of the thread an OfflineAudioContext renders its worklet on. */
const OFFLINE_WORKLET_THREAD = 'Offline AudioWo';

/**
 * Processor time (ms) the Chromium processes' offline worklet threads have run, as a counter that only grows: each
 * read adds what every such thread ran since the last read (a thread that ended adds nothing more). Read from Linux's
 * /proc/<pid>/task/<tid>/schedstat (nanoseconds on a core); NaN where /proc has no such threads.
 */
function workletCpuCounter(): () => number {
  const last = new Map<string, number>();
  let total = 0;
  return () => {
    let found = false;
    let pids: string[] = [];
    try {
      pids = readdirSync('/proc').filter((d) => /^\d+$/.test(d));
    } catch {
      return NaN;
    }
    for (const pid of pids) {
      try {
        if (!readFileSync(`/proc/${pid}/cmdline`, 'latin1').includes('chromium')) continue;
        for (const tid of readdirSync(`/proc/${pid}/task`)) {
          if (readFileSync(`/proc/${pid}/task/${tid}/comm`, 'latin1').trim() !== OFFLINE_WORKLET_THREAD) continue;
          const ns = Number(readFileSync(`/proc/${pid}/task/${tid}/schedstat`, 'latin1').split(' ')[0]);
          const key = `${pid}/${tid}`;
          total += ns - (last.get(key) ?? 0);
          last.set(key, ns);
          found = true;
        }
      } catch {
        // The process or thread ended while it was read.
      }
    }
    return found || last.size > 0 ? total / 1e6 : NaN;
  };
}

function cpuMs(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
}

/** The moving scene in Node, snapshots at the same frames as the page sends them: timed part's wall and processor time, ms. */
function nodeMoving(voices: number, seconds: number, warmSeconds: number): { wall: number; cpu: number } {
  const total = warmSeconds + seconds;
  const frames = Math.round((total * BENCH_RATE) / MOVING_STEP_FRAMES) * MOVING_STEP_FRAMES;
  const warmFrames = Math.round((warmSeconds * BENCH_RATE) / MOVING_STEP_FRAMES) * MOVING_STEP_FRAMES;
  const engine = new Engine({ sampleRate: BENCH_RATE, capacity: voices });
  const ids = benchSounds().map((s) => engine.addSound(s.channels, s.sampleRate));
  const list = Array.from({ length: voices / 2 }, (_, id) => ({ id, position: movingPosition(id, 0) }));
  const snap = { time: 0, listener: { position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } }, sources: list };
  engine.pushSnapshot(snap);
  for (const p of movingPlays(voices)) engine.play(ids[p.sound], { ...p.options, sourceId: p.source });
  engine.setTimeScale({ target: BENCH_RAMP.target, rampSeconds: total, easing: BENCH_RAMP.easing, startTime: 0 });
  const l = new Float32Array(128);
  const r = new Float32Array(128);
  let wall = 0;
  let cpu = 0;
  for (let f = 0; f < frames; f += MOVING_STEP_FRAMES) {
    if (f > 0) {
      snap.time = f / BENCH_RATE;
      for (const s of list) s.position = movingPosition(s.id, snap.time);
      engine.pushSnapshot(snap);
    }
    const w0 = performance.now();
    const c0 = cpuMs();
    for (let b = 0; b < MOVING_STEP_FRAMES / 128; b++) engine.render([l, r], 128);
    if (f >= warmFrames) {
      wall += performance.now() - w0;
      cpu += cpuMs() - c0;
    }
  }
  return { wall, cpu };
}

/** Runs the benchmark; prints a table unless `json`. Skips (with a note) when Chromium is absent. */
export async function run(options: { json: boolean }): Promise<object> {
  if (browserSuiteMode() !== 'run') {
    if (!options.json) console.log('skipped: /usr/bin/chromium not found');
    return { skipped: true };
  }
  const worklet = await workletSourceText({ minify: false });
  const page = await bundleForBrowser('bench/browser-engine-page.ts');
  const session = await openPage({
    '/index.html': '<!doctype html><meta charset="utf-8"><script type="module" src="/page.js"></script>',
    '/page.js': page,
    '/ralenti-processor.js': worklet,
  });
  const rows: { voices: number; chromiumRealTime: number; chromiumProcessorTime: number; nodeRealTime: number; chromiumOverNode: number; active: number }[] = [];
  const moving = { voices: MOVING_VOICES, active: 0, chromiumRealTime: [] as number[], chromiumProcessorTime: [] as number[], nodeRealTime: [] as number[], nodeProcessorTime: [] as number[] };
  try {
    // The page reads the worklet thread's processor time through this at its suspensions (see workletCpuMs there).
    await session.page.exposeFunction('benchWorkletCpuMs', workletCpuCounter());
    await session.page.waitForFunction(() => 'renderBench' in globalThis);
    const render = (voices: number) =>
      session.page.evaluate(
        ([v, s, w]) => (globalThis as unknown as { renderBench(v: number, s: number, w: number): Promise<Timing> }).renderBench(v, s, w),
        [voices, SECONDS, WARM_SECONDS] as const,
      );
    await render(8); // warm-up: JIT of the worklet scope
    nodeMs(8, 0.25, 0); // warm-up
    for (const voices of VOICES) {
      let c = { ms: Infinity, cpuMs: NaN, active: 0 };
      let cpu = Infinity;
      let n = Infinity;
      // Interleaved, so that both hosts see the same background load.
      for (let k = 0; k < REPEATS; k++) {
        const ck = await render(voices);
        if (ck.ms < c.ms) c = ck;
        cpu = Math.min(cpu, ck.cpuMs);
        n = Math.min(n, nodeMs(voices, SECONDS, WARM_SECONDS));
      }
      rows.push({ voices, chromiumRealTime: c.ms / 1000 / SECONDS, chromiumProcessorTime: cpu / 1000 / SECONDS, nodeRealTime: n / 1000 / SECONDS, chromiumOverNode: c.ms / n, active: c.active });
    }
    // The moving scene: 512 voices, propagation on (default tuning), sources circling, time scale gliding.
    const renderMoving = () =>
      session.page.evaluate(
        ([v, s, w]) => (globalThis as unknown as { renderMoving(v: number, s: number, w: number): Promise<Timing> }).renderMoving(v, s, w),
        [MOVING_VOICES, SECONDS, MOVING_WARM_SECONDS] as const,
      );
    const chromium: number[] = [];
    const chromiumCpu: number[] = [];
    const node: number[] = [];
    const nodeCpu: number[] = [];
    for (let k = 0; k < REPEATS; k++) {
      const c = await renderMoving();
      moving.active = c.active;
      chromium.push(c.ms / 1000 / SECONDS);
      chromiumCpu.push(c.cpuMs / 1000 / SECONDS);
      const n = nodeMoving(MOVING_VOICES, SECONDS, MOVING_WARM_SECONDS);
      node.push(n.wall / 1000 / SECONDS);
      nodeCpu.push(n.cpu / 1000 / SECONDS);
    }
    Object.assign(moving, { chromiumRealTime: chromium, chromiumProcessorTime: chromiumCpu, nodeRealTime: node, nodeProcessorTime: nodeCpu });
  } finally {
    await session.close();
  }
  if (!options.json) {
    console.log(`${SECONDS} s timed per row after ${WARM_SECONDS} s of warm-up in the same context, best of ${REPEATS}; fractions of one core in real time (OfflineAudioContext wall time ÷ audio duration)`);
    console.log('voices | Chromium worklet (OfflineAudioContext) | its worklet thread, processor time (best run) | Node engine, same scene | Chromium ÷ Node (wall) | active');
    for (const r of rows) {
      console.log(`${r.voices} | ${(r.chromiumRealTime * 100).toFixed(1)} % | ${(r.chromiumProcessorTime * 100).toFixed(1)} % | ${(r.nodeRealTime * 100).toFixed(1)} % | ${r.voices === 0 ? '—' : r.chromiumOverNode.toFixed(2) + '×'} | ${r.active}`);
    }
  }
  if (!options.json) {
    const pc = (v: number[]) => v.map((x) => `${(100 * x).toFixed(1)} %`).join(', ');
    console.log(
      `${MOVING_VOICES} voices on ${MOVING_VOICES / 2} moving sources, propagation on (default tuning), time scale gliding, ${SECONDS} s timed after ${MOVING_WARM_SECONDS} s, runs in order (goal ≤ 50 % of one core):` +
        ` Chromium worklet ${pc(moving.chromiumRealTime)} wall time of the rendering between snapshot suspensions, ${pc(moving.chromiumProcessorTime)} processor time of its worklet thread | Node ${pc(moving.nodeRealTime)} wall, ${pc(moving.nodeProcessorTime)} processor time | active ${moving.active}`,
    );
  }
  return { seconds: SECONDS, rows, moving };
}
