// Polyphase Kaiser-windowed sinc table for bandlimited interpolation (J. O. Smith, "Digital Audio Resampling",
// CCRMA: one stored low-pass impulse response, linear interpolation between table entries; Kaiser 1974 design).
import { besselI0, kaiserBeta, kaiserTaps } from './kaiser';
import { ALIAS_STOP_FRACTION, MAX_RATIO, tierDesigns, isQualityTier, type QualityTierName, type TierDesign } from './quality-tiers';
import { DspArgumentError } from './dsp-argument-error';

/** Options of a custom kernel table (the tiers use `KernelTable.forTier`). */
export interface KernelTableOptions {
  /** The design: attenuation (dB), passband and stopband edges (fractions of Nyquist), phases per sample. */
  design: TierDesign;
  /** Tier name reported by the table (default 'custom'). */
  name?: string;
  /** Override the Kaiser length estimate with this even tap count (2…512). */
  taps?: number;
}

const cache = new Map<QualityTierName, KernelTable>();

/**
 * Geometric step (5 %) between the kernel widths used above ratio 1: the stretch takes one of a small set of table
 * strides (about 27 per tier), each rounded down so the stretch is never below ratio · stretchPerRatio (the stopband
 * edge never rises above its design point; the passband edge may sit up to 5 % lower). The WebAssembly kernel keeps
 * one contiguous table per stride of this set.
 */
export const STRETCH_GRID_STEP = 1.05;

/**
 * One windowed-sinc kernel sampled at `phases` points per input sample, stored twice:
 * phase-major (`phaseMajor[φ·taps + t]`, each phase's taps contiguous, rows φ = 0…phases) for ratios ≤ 1, and
 * time-major (`dense[k]` = h(k/phases − taps/2), k = 0…taps·phases + 1) stepped at a stride for ratios > 1.
 */
export class KernelTable {
  /** Tier (or custom) name. */
  readonly name: string;
  /** Taps per output sample at ratio ≤ 1 (even). */
  readonly taps: number;
  /** Half the taps: the window reaches this many source frames either side of the position. */
  readonly halfTaps: number;
  /** Table phases per source frame (L). */
  readonly phases: number;
  /** Cutoff (−6 dB point) as a fraction of Nyquist at ratio ≤ 1; above 1 it is divided by the (quantised) ratio. */
  readonly cutoff: number;
  /** Kaiser shape parameter β. */
  readonly beta: number;
  /** Stretch per unit ratio above 1 (stopbandEdge / ALIAS_STOP_FRACTION, ≤ 1): the kernel widens by ratio · stretchPerRatio once that exceeds 1. */
  readonly stretchPerRatio: number;
  /** The design this table was built from. */
  readonly design: TierDesign;
  /** Phase-major rows, (phases + 1) × taps; row φ holds h(taps/2 − 1 − t + φ/phases), t = 0…taps−1. */
  readonly phaseMajor: Float32Array;
  /** Time-major samples h(k/phases − taps/2), k = 0…taps·phases, plus one trailing zero. */
  readonly dense: Float32Array;
  /** The table strides used (descending from `phases`; stretch = phases / stride) for ratios up to MAX_RATIO. */
  readonly strideGrid: Int32Array;
  /** gridFloor[m] = the largest stride of `strideGrid` ≤ m (the smallest one below it), m = 0…phases. */
  readonly gridFloor: Int32Array;

  /** Builds a table from a design (allocates; do this off the audio path). */
  constructor(options: KernelTableOptions) {
    const d = options.design;
    if (!(d.stopbandEdge > d.passbandEdge && d.passbandEdge > 0 && d.phases >= 2)) {
      throw new DspArgumentError('design', 'needs 0 < passbandEdge < stopbandEdge and phases ≥ 2');
    }
    this.name = options.name ?? 'custom';
    this.design = d;
    const estimate = kaiserTaps(d.attenuationDb, d.stopbandEdge - d.passbandEdge);
    const n = options.taps ?? estimate + (estimate & 1);
    if (!(n >= 2 && n <= 512 && n % 2 === 0)) throw new DspArgumentError('taps', 'must be an even count in 2…512');
    const l = d.phases;
    this.taps = n;
    this.halfTaps = n / 2;
    this.phases = l;
    this.cutoff = (d.passbandEdge + d.stopbandEdge) / 2;
    this.beta = kaiserBeta(d.attenuationDb);
    this.stretchPerRatio = Math.min(1, d.stopbandEdge / ALIAS_STOP_FRACTION);
    const fc = this.cutoff;
    const i0b = besselI0(this.beta);
    const total = n * l;
    const h = new Float64Array(total + 2);
    for (let k = 1; k < total; k++) {
      const u = k / l - n / 2; // source frames from the centre
      const x = (2 * u) / n;
      const arg = Math.PI * fc * u;
      const sinc = arg === 0 ? 1 : Math.sin(arg) / arg;
      h[k] = fc * sinc * (besselI0(this.beta * Math.sqrt(Math.max(0, 1 - x * x))) / i0b);
    }
    // Unit DC gain: the mean over phases of each phase's tap sum is 1.
    let sum = 0;
    for (let k = 0; k < total; k++) sum += h[k];
    const scale = l / sum;
    this.dense = new Float32Array(total + 2);
    for (let k = 0; k <= total; k++) this.dense[k] = h[k] * scale;
    this.phaseMajor = new Float32Array((l + 1) * n);
    for (let p = 0; p <= l; p++) {
      for (let t = 0; t < n; t++) this.phaseMajor[p * n + t] = this.dense[(n - 1 - t) * l + p];
    }
    const grid = [l];
    const last = Math.max(1, Math.floor(l / (MAX_RATIO * this.stretchPerRatio)));
    while (grid[grid.length - 1] > last) {
      const s = grid[grid.length - 1];
      grid.push(Math.max(last, Math.min(s - 1, Math.floor(s / STRETCH_GRID_STEP))));
    }
    this.strideGrid = Int32Array.from(grid);
    this.gridFloor = new Int32Array(l + 1);
    for (let m = 0, g = grid.length - 1; m <= l; m++) {
      while (g > 0 && grid[g - 1] <= m) g--;
      this.gridFloor[m] = grid[g];
    }
  }

  /** The shared table of a quality tier, built on first use and cached for the process (or worklet scope). */
  static forTier(tier: QualityTierName): KernelTable {
    let t = cache.get(tier);
    if (t) return t;
    if (!isQualityTier(tier)) throw new DspArgumentError('tier', `unknown quality tier ${JSON.stringify(tier)}`);
    t = new KernelTable({ design: tierDesigns[tier], name: tier });
    cache.set(tier, t);
    return t;
  }

  /** Stride through `dense` at playback ratio `ratio`: phases when unstretched, else the largest grid stride ≤ phases / (ratio · stretchPerRatio). */
  strideFor(ratio: number): number {
    const s = ratio * this.stretchPerRatio;
    return s <= 1 ? this.phases : this.gridFloor[Math.floor(this.phases / s)];
  }

  /** Largest window (source frames) any ratio up to `maxRatio` needs. */
  maxWindow(maxRatio: number): number {
    const stride = Math.max(1, this.strideFor(maxRatio));
    return Math.ceil((this.taps * this.phases) / stride) + 2;
  }
}
