// Short soak: 20 s of the simulated gameplay session of `npm run soak` (bench/soak-session.ts) renders without a
// non-finite sample, under the limiter ceiling, without engine errors, and with the heap within 5 % of its start.
import { describe, expect, it } from 'vitest';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { runSoak, formatSoak } from '../../bench/soak-session';

describe('soak session (short form)', () => {
  it('renders 20 s of gameplay with loops, time-scale changes and tuning swaps: finite, under the ceiling, heap flat', () => {
    setFlagsFromString('--expose-gc');
    const gc = runInNewContext('gc') as () => void;
    const f = runSoak({ seconds: 20, seed: 7, gc, heapUsed: () => process.memoryUsage().heapUsed });
    console.log(formatSoak(f));
    expect(f.frames).toBe(Math.ceil((20 * 48000) / 128) * 128);
    expect(f.nonFinite).toBe(0);
    expect(f.overCeiling).toBe(0);
    expect(f.errors).toBe(0);
    expect(f.peak).toBeGreaterThan(0.01); // audible throughout: silence would pass the rest
    expect(f.plays).toBeGreaterThan(50);
    expect(f.timeScaleChanges).toBeGreaterThan(1);
    expect(f.tuningSwaps).toBeGreaterThanOrEqual(1);
    expect(f.heapStart).toBeGreaterThan(0);
    expect(Math.abs(f.heapChange)).toBeLessThanOrEqual(0.05);
  }, 120_000);
});
