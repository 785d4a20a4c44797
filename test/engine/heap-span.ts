// One measurement of the allocation probes (test/engine/allocation-probe.ts, test/runtime/message-allocation-probe.ts;
// method in docs/allocation.md): V8's used heap read right before and right after a span of work, after a scavenge,
// with every collection that started inside the span counted from its 'gc' performance entry (a collection would hide
// allocation). Run in a `node --expose-gc` process.
import { getHeapStatistics } from 'node:v8';
import { PerformanceObserver, performance, type PerformanceEntry } from 'node:perf_hooks';

/** Node's `gc` with --expose-gc, or undefined without it. */
export const gc = (globalThis as unknown as { gc?: (o?: { type: 'major' | 'minor' }) => void }).gc;

/** Bytes the used heap grew by across one span, and the collections that started inside it. */
export interface SpanReading {
  bytes: number;
  collections: number;
}

/** Measures spans of work (`across`); watches 'gc' performance entries from its creation until `stop`. */
export function spanMeter(): { across: (work: () => void) => Promise<SpanReading>; stop: () => void } {
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
    collect({ type: 'minor' });
    await settle();
    const from = performance.now();
    const before = getHeapStatistics().used_heap_size;
    work();
    const after = getHeapStatistics().used_heap_size;
    const to = performance.now();
    await settle();
    return { bytes: after - before, collections: entries.filter((e) => e.startTime >= from && e.startTime <= to).length };
  };
  return { across, stop: () => observer.disconnect() };
}
