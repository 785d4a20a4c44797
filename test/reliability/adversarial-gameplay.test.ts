// Adversarial gameplay through the engine: 100,000 seeded random snapshots (4 runs of 25,000) mixing NaN, ±Infinity,
// 1e300, −0, zero distance, a listener inside its sources, supersonic approach and recession, teleports, backwards and
// repeated time stamps, hostile time scales, group changes and tuning swaps. Every block is finite, under the limiter
// ceiling, every voice's ratio inside the resampler's range, and every hostile input shows up in the counters.
import { afterAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { AdversarialDriver, frameArbitrary, type AdversarialTally } from './adversarial-frames';

const RUNS = [0x5eed01, 0x5eed02, 0x5eed03, 0x5eed04];
const SNAPSHOTS_PER_RUN = 25_000;
const CHUNK = 1000;
const tallies: AdversarialTally[] = [];

describe('engine under adversarial gameplay', () => {
  it.each(RUNS)('stays finite, under the ceiling, in ratio range, and counts every hostile input (seed %i, 25,000 snapshots)', (seed) => {
    const driver = new AdversarialDriver();
    for (let c = 0; c < SNAPSHOTS_PER_RUN / CHUNK; c++) {
      for (const frame of fc.sample(frameArbitrary, { seed: seed * 1000 + c, numRuns: CHUNK })) driver.step(frame);
    }
    const t = driver.tally;
    tallies.push({ ...t });
    expect(t.snapshots).toBe(SNAPSHOTS_PER_RUN);
    expect(t.nonFinite).toBe(0);
    expect(t.overCeiling).toBe(0);
    expect(t.ratioOutOfRange).toBe(0);
    expect(t.errors).toBe(0);
    expect(t.voicesChecked).toBeGreaterThan(SNAPSHOTS_PER_RUN); // voices were actually playing throughout
    expect(t.peak).toBeGreaterThan(0.05); // and audible: silence would pass the other checks trivially
    expect(t.hostileInputs).toBeGreaterThan(SNAPSHOTS_PER_RUN / 4);
    expect(t.hostileCounted).toBe(t.hostileInputs);
  }, 180_000);

  afterAll(() => {
    if (tallies.length === 0) return;
    const sum = (k: keyof AdversarialTally) => tallies.reduce((a, t) => a + t[k], 0);
    console.log(
      `adversarial gameplay: ${sum('snapshots')} snapshots, ${sum('frames')} frames, ${sum('hostileInputs')} hostile inputs ` +
        `(${sum('hostileCounted')} counted), ${sum('clamps')} clamps, ${sum('refused')} refused, ${sum('steals')} steals, ` +
        `${sum('voicesChecked')} voice ratios checked, ${sum('nonFinite')} non-finite samples, peak ${Math.max(...tallies.map((t) => t.peak)).toFixed(4)}`,
    );
  });
});
