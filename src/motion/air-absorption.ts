// Atmospheric absorption of sound, ISO 9613-1:1993 equations (3)–(5): pure-tone attenuation coefficient from
// temperature, relative humidity and pressure; and the cutoff of a low-pass that stands in for it at a distance.
import type { Celsius, Hz, Meters } from '../units';

/** Reference pressure p_r, kPa (ISO 9613-1). */
export const REFERENCE_PRESSURE_KPA = 101.325;
/** Reference temperature T0, K (ISO 9613-1). */
export const REFERENCE_TEMPERATURE_K = 293.15;
/** Triple-point temperature T01, K (ISO 9613-1). */
export const TRIPLE_POINT_K = 273.16;
/** Attenuation, dB, that the stand-in low-pass has at its cutoff (a Butterworth biquad's −3 dB point). */
export const AIR_CUTOFF_LOSS_DB = 3;

/** Air state for ISO 9613-1. */
export interface AirState {
  /** Temperature, °C (−50…60). */
  temperatureCelsius: Celsius;
  /** Relative humidity, % (0…100). */
  relativeHumidity: number;
  /** Atmospheric pressure, kPa (50…120). */
  pressureKilopascals: number;
}

/** Attenuation coefficient α (dB per metre) of a pure tone at `f` Hz in air `air`, ISO 9613-1 eq. (3)–(5). */
export function airAbsorptionDbPerMeter(f: Hz, air: AirState): number {
  const T = air.temperatureCelsius + 273.15;
  const pa = air.pressureKilopascals;
  const pr = REFERENCE_PRESSURE_KPA;
  const psat = pr * Math.pow(10, -6.8346 * Math.pow(TRIPLE_POINT_K / T, 1.261) + 4.6151);
  const h = (air.relativeHumidity * psat) / pa;
  const frO = (pa / pr) * (24 + (4.04e4 * h * (0.02 + h)) / (0.391 + h));
  const tr = T / REFERENCE_TEMPERATURE_K;
  const frN = (pa / pr) * Math.pow(tr, -0.5) * (9 + 280 * h * Math.exp(-4.17 * (Math.pow(tr, -1 / 3) - 1)));
  const f2 = f * f;
  return (
    8.686 *
    f2 *
    (1.84e-11 * (pr / pa) * Math.sqrt(tr) +
      Math.pow(tr, -2.5) * ((0.01275 * Math.exp(-2239.1 / T)) / (frO + f2 / frO) + (0.1068 * Math.exp(-3352.0 / T)) / (frN + f2 / frN)))
  );
}

/** Log-spaced frequencies of the cutoff table, Hz (100 Hz … 96 kHz). */
const TABLE_LOW_HZ = 100;
const TABLE_STEPS = 120;
const TABLE_OCTAVES = Math.log2(96000 / TABLE_LOW_HZ);

/**
 * Distance → cutoff of the stand-in low-pass: the frequency whose air loss over the distance is AIR_CUTOFF_LOSS_DB.
 * α(f) rises monotonically with f, so the table of α on a log grid is inverted by bisection and log interpolation.
 */
export class AirAbsorption {
  private readonly alpha = new Float64Array(TABLE_STEPS + 1);
  /** The distance `lookUp` reads, m (a field declared with a double). */
  distance = 0.5;
  /** The cutoff `lookUp` wrote, Hz (100…96000). */
  cutoff = 0.5;

  /** Tabulates α for `air`. */
  constructor(air: AirState) {
    this.configure(air);
  }

  /** Re-tabulates α for a new air state (allocation-free). */
  configure(air: AirState): void {
    for (let i = 0; i <= TABLE_STEPS; i++) this.alpha[i] = airAbsorptionDbPerMeter(this.frequency(i), air);
  }

  /** Cutoff for `distance` m: the frequency losing AIR_CUTOFF_LOSS_DB over it (96 kHz or more when nearly none). */
  cutoffHz(distance: Meters): Hz {
    this.distance = distance;
    this.lookUp();
    return this.cutoff;
  }

  /**
   * `cutoffHz` of the `distance` field into the `cutoff` field: the render path's form, taking and returning no double
   * (V8 boxes one passed to or returned from a call it does not inline); each branch stores its own value.
   */
  lookUp(): void {
    const distance = this.distance;
    if (!(distance > 0)) {
      this.cutoff = 96000;
      return;
    }
    const target = AIR_CUTOFF_LOSS_DB / distance;
    const a = this.alpha;
    if (target >= a[TABLE_STEPS]) {
      this.cutoff = 96000;
      return;
    }
    if (target <= a[0]) {
      this.cutoff = TABLE_LOW_HZ;
      return;
    }
    let lo = 0;
    let hi = TABLE_STEPS;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (a[mid] <= target) lo = mid;
      else hi = mid;
    }
    // Interpolate log α against log f (α ∝ f^k locally).
    const u = Math.log(target / a[lo]) / Math.log(a[hi] / a[lo]);
    this.cutoff = TABLE_LOW_HZ * Math.pow(2, ((lo + u) / TABLE_STEPS) * TABLE_OCTAVES);
  }

  private frequency(i: number): Hz {
    return TABLE_LOW_HZ * Math.pow(2, (i / TABLE_STEPS) * TABLE_OCTAVES);
  }
}
