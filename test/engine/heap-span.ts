// One measurement of the allocation probes (test/engine/allocation-probe.ts, test/runtime/message-allocation-probe.ts;
// method in docs/allocation.md): V8's used heap read right before and right after a span of work, after a scavenge,
// with every collection that started inside the span counted from its 'gc' performance entry (a collection would hide
// allocation). Beside the total, the growth of each heap space (`v8.getHeapSpaceStatistics`), read just outside the
// total's readings: what the code allocates lands in the young generation (new_space; new_large_object_space for
// objects over ≈128 KB), what V8 makes while it compiles (bytecode, feedback, code) in old_space and code_space.
// Run in a `node --expose-gc` process.
import { getHeapSpaceStatistics, getHeapStatistics } from 'node:v8';
import { PerformanceObserver, performance, type PerformanceEntry } from 'node:perf_hooks';

/** Node's `gc` with --expose-gc, or undefined without it. */
export const gc = (globalThis as unknown as { gc?: (o?: { type: 'major' | 'minor' }) => void }).gc;

/** Bytes the used heap grew by across one span, and the collections that started inside it. */
export interface SpanReading {
  bytes: number;
  collections: number;
  /** Growth of each heap space's used size across the span, bytes, by V8's space name (new_space, old_space, …); empty unless asked for. */
  spaces: Record<string, number>;
}

/** The young generation's space, where the code's own objects are allocated (objects over ≈128 KB go to new_large_object_space). */
export const YOUNG = 'new_space';

/** Used bytes of every heap space, by name, into `out`. */
function readSpaces(out: Record<string, number>): void {
  for (const s of getHeapSpaceStatistics()) out[s.space_name] = s.space_used_size;
}

/** Options of spanMeter. */
export interface SpanMeterOptions {
  /** Also read the growth of each heap space (default false: the extra readings change what V8 compiles around them). */
  spaces?: boolean;
}

/** Measures spans of work (`across`); watches 'gc' performance entries from its creation until `stop`. */
export function spanMeter(options: SpanMeterOptions = {}): { across: (work: () => void) => Promise<SpanReading>; stop: () => void } {
  const withSpaces = options.spaces === true;
  if (gc === undefined) throw new Error('run with node --expose-gc');
  const collect = gc;
  const entries: PerformanceEntry[] = [];
  const observer = new PerformanceObserver((list) => entries.push(...list.getEntries()));
  observer.observe({ entryTypes: ['gc'] });
  const settle = async () => {
    for (let i = 0; i < 3; i++) await new Promise((r) => setImmediate(r));
    await new Promise((r) => setTimeout(r, 0));
    entries.push(...observer.takeRecords());
  };
  const across = async (work: () => void): Promise<SpanReading> => {
    const spacesBefore: Record<string, number> = {};
    const spaces: Record<string, number> = {};
    collect({ type: 'minor' });
    await settle();
    const from = performance.now();
    if (withSpaces) readSpaces(spacesBefore);
    const before = getHeapStatistics().used_heap_size;
    work();
    const after = getHeapStatistics().used_heap_size;
    if (withSpaces) readSpaces(spaces);
    const to = performance.now();
    // The space readings allocate their own result objects in new_space, a little less once V8 has optimised them; the
    // young generation's growth is therefore the total's (whose readings' overhead is steady) minus the other spaces'.
    let others = 0;
    for (const name in spaces) {
      spaces[name] -= spacesBefore[name] ?? 0;
      if (name !== YOUNG) others += spaces[name];
    }
    if (withSpaces) spaces[YOUNG] = after - before - others;
    await settle();
    return { bytes: after - before, collections: entries.filter((e) => e.startTime >= from && e.startTime <= to).length, spaces };
  };
  return { across, stop: () => observer.disconnect() };
}
