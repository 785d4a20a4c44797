import { describe, expect, it } from 'vitest';
import { besselI0, kaiserBeta, kaiserTaps, kaiserWindow, KernelTable, qualityTiers } from '../../src/dsp';

describe('Kaiser β formula', () => {
  // docs/references.md §3a: Kaiser 1974 / Oppenheim & Schafer DTSP pp. 475–476, as implemented by SciPy kaiser_beta.
  const rows: [number, number, number, string][] = [
    [65, 6.20426, 1e-5, 'VERIFIED: SciPy docs example kaiser_beta(65)'],
    [60, 5.65326, 1e-9, 'COMPUTED from the formula'],
    [40, 3.3953210523, 1e-9, 'COMPUTED from the formula'],
    [30, 2.1166248611, 1e-9, 'COMPUTED from the formula'],
    [21, 0, 0, 'COMPUTED from the formula'],
    [20, 0, 0, 'COMPUTED from the formula'],
    [80, 7.85726, 1e-9, 'COMPUTED from the formula'],
    [100, 10.06126, 1e-9, 'COMPUTED from the formula'],
    [120, 12.26526, 1e-9, 'COMPUTED from the formula'],
  ];
  it.each(rows)('β(A = %d dB) is %f', (a, beta, tol) => {
    expect(Math.abs(kaiserBeta(a) - beta)).toBeLessThanOrEqual(tol);
  });
});

describe('Kaiser length estimate (kaiserord)', () => {
  // docs/references.md §3a: SciPy 1.17.1 kaiserord values (COMPUTED status in that file).
  const rows: [number, number, number][] = [
    [60, 0.1, 74],
    [65, 0.1, 81],
    [80, 0.05, 202],
    [100, 0.02, 643],
  ];
  it.each(rows)('kaiserord(%d dB, width %f) gives %d taps', (a, w, n) => {
    expect(kaiserTaps(a, w)).toBe(n);
  });

  it('gives M + 1 = 38 taps and β = 5.653 for the Oppenheim & Schafer low-pass example (A = 60 dB, Δω = 0.2π)', () => {
    // docs/references.md §3a: O&S DTSP Kaiser design example, order M = 37 and β = 5.653 (book numbers from memory;
    // (A − 8)/(2.285·Δω) = 36.219 → 37 COMPUTED). Δω = 0.2π rad/sample is a width of 0.2 of Nyquist.
    expect(kaiserTaps(60, 0.2)).toBe(37 + 1);
    expect(kaiserBeta(60)).toBeCloseTo(5.653, 3);
  });
});

describe('Kaiser window', () => {
  it('matches NumPy np.kaiser(9, 5.0) and I0(5)', () => {
    // docs/references.md §3a: NumPy 2.4 np.kaiser values (COMPUTED status), tolerance 1e-8.
    const expected = [0.03671089, 0.23054433, 0.55285177, 0.86801716, 1, 0.86801716, 0.55285177, 0.23054433, 0.03671089];
    const w = kaiserWindow(new Float64Array(9), 5);
    for (let i = 0; i < 9; i++) expect(Math.abs(w[i] - expected[i])).toBeLessThan(1e-8);
    expect(Math.abs(besselI0(5) - 27.2398718236)).toBeLessThan(1e-8);
  });
});

describe('kernel tables', () => {
  it.each(qualityTiers.map((t) => [t]))('builds the %s table once and returns the cached instance', (tier) => {
    expect(KernelTable.forTier(tier)).toBe(KernelTable.forTier(tier));
  });

  it.each(qualityTiers.map((t) => [t]))('gives the %s kernel unit DC gain in every phase (within its stopband ripple)', (tier) => {
    const t = KernelTable.forTier(tier);
    for (let p = 0; p < t.phases; p += 7) {
      let s = 0;
      for (let j = 0; j < t.taps; j++) s += t.phaseMajor[p * t.taps + j];
      expect(Math.abs(s - 1)).toBeLessThan(1e-3);
    }
  });

  it('rejects an unknown tier name with an error naming the argument', () => {
    expect(() => KernelTable.forTier('ultra' as never)).toThrow(/tier/);
  });
});
