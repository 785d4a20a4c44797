// The fuzz suites' harness: cases drawn from a fast-check arbitrary with a fixed seed and a fixed count (never a
// time budget), every case run, failures counted (not stopped at the first), and the counts printed.
import fc from 'fast-check';

/** Result of one fuzz run. */
export interface FuzzCounts {
  name: string;
  seed: number;
  tried: number;
  failures: number;
  /** The first failing case and why (JSON-ish text), or null. */
  first: string | null;
}

function show(value: unknown): string {
  try {
    const s = JSON.stringify(value, (_k, v) => (v instanceof Uint8Array ? `<${v.length} bytes>` : typeof v === 'number' && !Number.isFinite(v) ? String(v) : v));
    return s === undefined ? String(value) : s.length > 400 ? s.slice(0, 400) + '…' : s;
  } catch {
    return String(value);
  }
}

/**
 * Runs `check` on `runs` cases of `arb` drawn with `seed`; a case fails when `check` throws or returns a string
 * (the reason). Prints "[fuzz] name: N cases tried, F failures (seed S)" and returns the counts.
 */
export async function fuzz<T>(name: string, arb: fc.Arbitrary<T>, runs: number, seed: number, check: (value: T) => void | string | Promise<void | string>): Promise<FuzzCounts> {
  const cases = fc.sample(arb, { seed, numRuns: runs });
  const counts: FuzzCounts = { name, seed, tried: 0, failures: 0, first: null };
  for (const c of cases) {
    counts.tried++;
    let why: string | null = null;
    try {
      const r = await check(c);
      if (typeof r === 'string') why = r;
    } catch (e) {
      why = `threw ${(e as Error)?.stack ?? String(e)}`;
    }
    if (why !== null) {
      counts.failures++;
      counts.first ??= `${show(c)}: ${why}`;
    }
  }
  console.log(`[fuzz] ${name}: ${counts.tried} cases tried, ${counts.failures} failures (seed ${seed})${counts.first ? `; first: ${counts.first}` : ''}`);
  return counts;
}
