// The measurement of the zero-allocation check (docs/allocation.md), run in its own `node --expose-gc` process on the
// engine bundled by esbuild as the package ships it (zero-allocation.test.ts builds and spawns it). Prints one JSON line.
// "0 bytes": V8's used heap size (every space) read right before and right after each span of blocks differs by exactly
// what the two readings allocate themselves (measured around an empty span, after 20 such readings). With no collection in between the used
// heap only grows, by every byte allocated. A collection inside a span is counted from its 'gc' performance entry:
// a scavenge would hide allocation, so the test fails on any.
import { YOUNG, gc, spanMeter } from './heap-span';
import type { KernelPreference } from '../../src/index';
import { allocationScene } from './allocation-scene';

/** Blocks rendered before measuring, twice with a full collection between, in calls of WARM_UP_CALL. */
const WARM_UP_BLOCKS = 2000;
const WARM_UP_CALL = 50;
/** Blocks measured, in spans of SPAN_BLOCKS, each after a scavenge (small enough to fit the young generation). */
const MEASURED_BLOCKS = 10_000;
const SPAN_BLOCKS = 50;

/** What the probe reports. */
export interface AllocationReport {
  kernel: string;
  blocks: number;
  /** Bytes allocated over all measured blocks (reading overhead subtracted). */
  bytes: number;
  /** Collections that started inside a measured span. */
  collections: number;
  /** Bytes per block of each span. */
  spans: number[];
  /** Bytes per block of each span by heap space (V8's names; each space's reading overhead subtracted; new_space ≥ 0). */
  spaceSpans: Record<string, number[]>;
  /** Voices playing or virtual at the end, and render errors. */
  voices: number;
  errors: number;
}

async function main(): Promise<void> {
  if (gc === undefined) throw new Error('run with node --expose-gc');
  const kernel = (process.argv[2] ?? 'auto') as KernelPreference;
  // A scavenge before each span empties the young generation; a full collection would also let V8 drop optimised
  // code that embeds objects it no longer holds ("weak objects"), and code running unoptimised boxes its doubles.
  const { across, stop } = spanMeter({ spaces: true });

  const scene = allocationScene(kernel);
  for (let b = 0; b < WARM_UP_BLOCKS; b += WARM_UP_CALL) scene.run(WARM_UP_CALL);
  gc({ type: 'major' }); // the set-up's garbage; then warm up again so that what it dropped is optimised again
  for (let b = 0; b < WARM_UP_BLOCKS; b += WARM_UP_CALL) scene.run(WARM_UP_CALL);
  // What the readings allocate themselves, once it has settled: the first calls of getHeapStatistics allocate 16 bytes
  // more (its result object's layout is still changing), which would show as 16 bytes in every span.
  const nothing = () => {};
  for (let i = 0; i < 20; i++) await across(nothing);
  const overhead = await across(nothing);
  const report: AllocationReport = { kernel: scene.engine.stats.kernel, blocks: MEASURED_BLOCKS, bytes: 0, collections: overhead.collections, spans: [], spaceSpans: {}, voices: 0, errors: 0 };
  for (const name in overhead.spaces) report.spaceSpans[name] = [];
  const span = () => scene.run(SPAN_BLOCKS);
  for (let b = 0; b < MEASURED_BLOCKS; b += SPAN_BLOCKS) {
    const m = await across(span);
    report.bytes += m.bytes - overhead.bytes;
    report.collections += m.collections;
    report.spans.push((m.bytes - overhead.bytes) / SPAN_BLOCKS);
    for (const name in overhead.spaces) report.spaceSpans[name].push((m.spaces[name] - overhead.spaces[name]) / SPAN_BLOCKS);
    // Not below 0: objects V8 moves from new_space to old_space (seen once in 60 runs: +125 KB in old_space, the total
    // unchanged) are no allocation, and no allocation is negative.
    const young = report.spaceSpans[YOUNG];
    young[young.length - 1] = Math.max(0, young[young.length - 1]);
  }
  stop();
  const st = scene.engine.stats;
  report.voices = st.activeVoices + st.virtualVoices;
  report.errors = st.errors;
  process.stdout.write(`${JSON.stringify(report)}\n`);
}

void main();
