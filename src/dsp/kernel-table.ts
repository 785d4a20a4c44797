// Polyphase Kaiser-windowed sinc table for bandlimited interpolation (J. O. Smith, "Digital Audio Resampling",
// CCRMA: one stored low-pass impulse response, linear interpolation between table entries; Kaiser 1974 design).
import { besselI0, kaiserBeta, kaiserTaps } from './kaiser';
import { MAX_RATIO, aliasStopFraction, tierDesignAt, isQualityTier, type QualityTierName, type TierDesign } from './quality-tiers';
import { DspArgumentError } from './dsp-argument-error';

/** Options of a custom kernel table (the tiers use `KernelTable.forTier`). */
export interface KernelTableOptions {
  /** The design: attenuation (dB), passband and stopband edges (fractions of Nyquist), phases per sample. */
  design: TierDesign;
  /** Tier name reported by the table (default 'custom'). */
  name?: string;
  /** Override the Kaiser length estimate with this even tap count (2…512). */
  taps?: number;
  /** Limit of the stretched kernel's stopband edge, fraction of the output Nyquist (default `aliasStopFraction(48000)` = 7/6). */
  aliasStop?: number;
  /** Samples designed earlier for the same design and taps (`toData()` of such a table): used as they are, no design work. */
  samples?: { readonly dense: Float32Array; readonly phaseMajor: Float32Array };
}

/** A designed table as plain data (arrays transferable between threads): `KernelTable.fromData` rebuilds it without design work. */
export interface KernelTableData {
  /** Tier (or custom) name. */
  readonly name: string;
  /** The design the samples came from. */
  readonly design: TierDesign;
  /** Stretched-stopband limit, fraction of the output Nyquist. */
  readonly aliasStop: number;
  /** Taps per output sample at ratio ≤ 1 (even). */
  readonly taps: number;
  /** `KernelTable.dense`. */
  readonly dense: Float32Array;
  /** `KernelTable.phaseMajor`. */
  readonly phaseMajor: Float32Array;
}

const cache = new Map<string, KernelTable>();
let designs = 0;

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
  /** Stretch per unit ratio above 1 (stopbandEdge / aliasStop, ≤ 1): the kernel widens by ratio · stretchPerRatio once that exceeds 1. */
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

  /** Limit of the stretched kernel's stopband edge, fraction of the output Nyquist (`aliasStopFraction` of the output rate). */
  readonly aliasStop: number;

  /** Builds a table from a design, or from `data` without design work (allocates; do this off the audio path). */
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
    const aliasStop = options.aliasStop ?? aliasStopFraction(48000);
    if (!(aliasStop >= 1 && aliasStop <= 2)) throw new DspArgumentError('aliasStop', 'must be in 1…2');
    this.aliasStop = aliasStop;
    this.stretchPerRatio = Math.min(1, d.stopbandEdge / aliasStop);
    const data = options.samples;
    if (data !== undefined) {
      if (data.dense.length !== n * l + 2 || data.phaseMajor.length !== (l + 1) * n) throw new DspArgumentError('data', 'array lengths do not match taps and phases');
      this.dense = data.dense;
      this.phaseMajor = data.phaseMajor;
    } else {
      designs++;
      [this.dense, this.phaseMajor] = designSamples(d, n, this.cutoff, this.beta);
    }
    const step = d.gridStep ?? STRETCH_GRID_STEP;
    if (!(step > 1 && step <= 2)) throw new DspArgumentError('design', 'gridStep must be in (1, 2]');
    const grid = [l];
    const last = Math.max(1, Math.floor(l / (MAX_RATIO * this.stretchPerRatio)));
    while (grid[grid.length - 1] > last) {
      const s = grid[grid.length - 1];
      grid.push(Math.max(last, Math.min(s - 1, Math.floor(s / step))));
    }
    this.strideGrid = Int32Array.from(grid);
    this.gridFloor = new Int32Array(l + 1);
    for (let m = 0, g = grid.length - 1; m <= l; m++) {
      while (g > 0 && grid[g - 1] <= m) g--;
      this.gridFloor[m] = grid[g];
    }
  }

  /** Tables designed (Kaiser sums evaluated) in this realm so far; tables rebuilt by `fromData` do not count. */
  static get designCount(): number {
    return designs;
  }

  /** Rebuilds a table from `toData()` output (e.g. transferred from another thread) without design work. */
  static fromData(data: KernelTableData): KernelTable {
    return new KernelTable({ design: data.design, name: data.name, taps: data.taps, aliasStop: data.aliasStop, samples: data });
  }

  /** The table as plain data; its arrays are this table's own (copy them before transferring if this table stays in use). */
  toData(): KernelTableData {
    return { name: this.name, design: this.design, aliasStop: this.aliasStop, taps: this.taps, dense: this.dense, phaseMajor: this.phaseMajor };
  }

  /** The shared table of a quality tier at output rate `sampleRate` (Hz, 8000…768000, default 48000), built on first use and cached for the process (or worklet scope). */
  static forTier(tier: QualityTierName, sampleRate = 48000): KernelTable {
    if (!isQualityTier(tier)) throw new DspArgumentError('tier', `unknown quality tier ${JSON.stringify(tier)}`);
    if (!(sampleRate >= 8000 && sampleRate <= 768000)) throw new DspArgumentError('sampleRate', `must be 8000…768000 Hz, got ${sampleRate}`);
    const { design, aliasStop } = tierDesignAt(tier, sampleRate);
    const key = `${tier}:${design.passbandEdge}:${design.stopbandEdge}:${design.phases}:${aliasStop}`;
    let t = cache.get(key);
    if (t) return t;
    t = new KernelTable({ design, name: tier, aliasStop });
    cache.set(key, t);
    return t;
  }

  /** Stride through `dense` at playback ratio `ratio`: phases when unstretched, else the largest grid stride ≤ phases / (ratio · stretchPerRatio). */
  strideFor(ratio: number): number {
    this.strideRatio = ratio;
    return this.strideForQuery();
  }

  /** The ratio `strideForQuery` reads (a field: V8 boxes a double passed to a call it does not inline). */
  strideRatio = 0.5;

  /** `strideFor(strideRatio)`: the render path's form (an integer comes back, so nothing is boxed). */
  strideForQuery(): number {
    const s = this.strideRatio * this.stretchPerRatio;
    return s <= 1 ? this.phases : this.gridFloor[Math.floor(this.phases / s)];
  }

  /** Largest window (source frames) any ratio up to `maxRatio` needs. */
  maxWindow(maxRatio: number): number {
    const stride = Math.max(1, this.strideFor(maxRatio));
    return Math.ceil((this.taps * this.phases) / stride) + 2;
  }
}

/** The Kaiser-windowed sinc sampled at `d.phases` points per frame: [dense, phaseMajor] with unit DC gain. */
function designSamples(d: TierDesign, n: number, fc: number, beta: number): [Float32Array, Float32Array] {
  const l = d.phases;
  const i0b = besselI0(beta);
  const total = n * l;
  const h = new Float64Array(total + 2);
  for (let k = 1; k < total; k++) {
    const u = k / l - n / 2; // source frames from the centre
    const x = (2 * u) / n;
    const arg = Math.PI * fc * u;
    const sinc = arg === 0 ? 1 : Math.sin(arg) / arg;
    h[k] = fc * sinc * (besselI0(beta * Math.sqrt(Math.max(0, 1 - x * x))) / i0b);
  }
  // Unit DC gain: the mean over phases of each phase's tap sum is 1.
  let sum = 0;
  for (let k = 0; k < total; k++) sum += h[k];
  const scale = l / sum;
  const dense = new Float32Array(total + 2);
  for (let k = 0; k <= total; k++) dense[k] = h[k] * scale;
  const phaseMajor = new Float32Array((l + 1) * n);
  for (let p = 0; p <= l; p++) {
    for (let t = 0; t < n; t++) phaseMajor[p * n + t] = dense[(n - 1 - t) * l + p];
  }
  return [dense, phaseMajor];
}
