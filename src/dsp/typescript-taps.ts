// The TypeScript reference kernel of StreamReader (J. O. Smith, "Digital Audio Resampling", CCRMA): per output
// sample a windowed-sinc dot product over the source, two adjacent table phases linearly interpolated; a kernel
// stretched by the ratio above 1.
import { KernelTable } from './kernel-table';
import { MAX_RATIO } from './quality-tiers';
import { ReadCursor } from './read-cursor';
import { columnSum, dotColumns, dotRows, dotRowsSplit, dotRowsSplitPair, dotStride, fillRows, fillStride, rowSum, rowSumPair } from './kernel-dot';

const EMPTY = new Float64Array(0);

/** The block loop of the TypeScript kernel: a mono in-range fast path (unstretched: output samples in pairs where it can), and a general path (edges, loop seams, several channels). */
export class TypeScriptTaps {
  /** Ratio at the block's first sample and its change over the block (handed in fields: V8 boxes a double passed to a call it does not inline). */
  rs = 0.5;
  /** See rs. */
  dr = 0.5;
  private table!: KernelTable;
  private readonly cur: ReadCursor;
  private readonly channels: number;
  private readonly scratch: Float32Array[] = [];
  private weights: Float64Array = EMPTY;
  /** The stretched window's span per table offset ci at stride `spanStride` (see spans; 0: not filled). */
  private before = new Int32Array(0);
  private count = new Int32Array(0);
  private spanStride = 0;
  /** Doubles handed to and from kernel-dot (no boxed doubles): fractions in [0] and [1], sums in [1] to [3], as each function says. */
  private readonly dotIo = new Float64Array(4);

  /** Scratch for `channels` channels and the table's widest (ratio 4) window. */
  constructor(cur: ReadCursor, channels: number, table: KernelTable) {
    this.cur = cur;
    this.channels = channels;
    this.setTable(table);
  }

  /** Switches the table; allocates only when it needs a wider window. */
  setTable(table: KernelTable): void {
    this.table = table;
    this.spanStride = 0;
    if (this.before.length <= table.phases) {
      this.before = new Int32Array(table.phases + 1);
      this.count = new Int32Array(table.phases + 1);
    }
    const need = table.maxWindow(MAX_RATIO);
    if (this.weights.length < need) {
      this.weights = new Float64Array(need);
      for (let c = 0; c < this.channels; c++) this.scratch[c] = new Float32Array(need);
    }
  }

  /** Renders `frames` samples to out[c][o…], ratio per sample from (rs, dr) or from ratios[ro…], advancing the cursor. */
  render(out: readonly Float32Array[], o: number, frames: number, ratios: Float32Array | null, ro: number): void {
    const rs = this.rs;
    const dr = this.dr;
    const cur = this.cur;
    const t = this.table;
    const taps = t.taps | 0;
    const phases = t.phases | 0;
    const halfTaps = t.halfTaps | 0;
    const halfDense = (halfTaps * phases) | 0;
    const pm = t.phaseMajor;
    const dense = t.dense;
    const mono = cur.channelsInUse === 1;
    const x = cur.sources[0];
    const y = out[0];
    const hi = cur.loop ? cur.loopEnd : cur.length;
    let lo = cur.loop && cur.wrapped ? cur.loopStart : 0;
    // The stride is looked up once per ratio: once per block for a constant ratio, and for a ramp whose ends fall on
    // the same stride (rs + (dr·i)/frames is monotonic in i step by step, and strideFor is monotonic in the ratio).
    let lastR = -1;
    let stride = 0;
    if (ratios === null && frames > 0) {
      const s0 = t.strideFor(rs) | 0;
      if (s0 === (t.strideFor(rs + (dr * (frames - 1)) / frames) | 0)) {
        stride = s0;
        lastR = Infinity;
      }
    }
    // The next sample's ratio once looked ahead for pairing (taken once: sanitize counts clamps).
    let rNext = 0.5;
    let haveNext = false;
    for (let i = 0; i < frames; i++) {
      let r = rNext;
      if (haveNext) haveNext = false;
      else r = ratios === null ? (dr === 0 ? rs : rs + (dr * i) / frames) : cur.sanitize(ratios[ro + i]);
      if (r !== lastR && lastR !== Infinity) {
        stride = t.strideFor(r) | 0;
        lastR = r;
      }
      let pos = cur.pos;
      const n = Math.floor(pos) | 0;
      const frac = pos - n;
      if (stride === phases) {
        const mLo = (n - halfTaps + 1) | 0;
        if (mono && mLo >= lo && mLo + taps <= hi) {
          const ph = frac * phases;
          const phi = ph | 0;
          const k0 = (phi * taps) | 0;
          const io = this.dotIo;
          // Look ahead: when the next sample is also on this path, both are summed in one loop (twice the
          // independent chains, one read of a shared window; each sample keeps its own order of additions).
          let paired = false;
          let k2 = 0;
          let m2 = 0;
          if (i + 1 < frames) {
            const r2 = ratios === null ? (dr === 0 ? rs : rs + (dr * (i + 1)) / frames) : cur.sanitize(ratios[ro + i + 1]);
            rNext = r2;
            haveNext = true;
            if (r2 !== lastR && lastR !== Infinity) {
              stride = t.strideFor(r2) | 0;
              lastR = r2;
            }
            // The next position as moveTo gives it without a wrap. It is ≥ pos, so m2 ≥ mLo ≥ lo; a wrap (p2 ≥ loopEnd,
            // which is hi) fails m2 + taps ≤ hi and is left to the next sample's own step.
            const p2 = pos + r;
            const n2 = Math.floor(p2) | 0;
            const ph2 = (p2 - n2) * phases;
            const phi2 = ph2 | 0;
            m2 = (n2 - halfTaps + 1) | 0;
            k2 = (phi2 * taps) | 0;
            // Two windows apart are paired only for steps above 1/2: below, one sample left alone lets the
            // following ones pair on a shared window (the cheaper form).
            if (stride === phases && m2 + taps <= hi && (m2 === mLo || r > 0.5)) {
              if (ph === phi && ph2 === phi2) {
                rowSumPair(pm, k0, k2, taps, x, mLo, m2, io);
                paired = true;
              } else if (ph !== phi && ph2 !== phi2) {
                io[0] = ph - phi;
                io[1] = ph2 - phi2;
                dotRowsSplitPair(pm, k0, k2, taps, x, mLo, m2, io);
                paired = true;
              }
            }
          }
          // On a table phase (ph = phi) the second row's weight is 0, and a0 + 0·(…) is a0 whenever a0 is finite
          // (then so is every tap, and the second row's sum): one row gives the same sample. A non-finite a0 (a
          // non-finite source sample in the window) takes the full form.
          if (paired && ph === phi) {
            const b = io[3];
            this.finishRow(y, o + i, k0, mLo);
            io[2] = b;
            this.finishRow(y, o + i + 1, k2, m2);
          } else if (paired) {
            y[o + i] = io[2];
            y[o + i + 1] = io[3];
          } else if (ph === phi) {
            rowSum(pm, k0, taps, x, mLo, io);
            this.finishRow(y, o + i, k0, mLo);
          } else {
            io[0] = ph - phi;
            dotRowsSplit(pm, k0, taps, x, mLo, io);
            y[o + i] = io[1];
          }
          if (paired) {
            i++;
            pos += r;
            r = rNext;
            haveNext = false;
          }
          cur.lastStretch = 1;
        } else this.renderOne(out, o + i, stride);
      } else {
        if (stride !== this.spanStride) this.spans(stride);
        const c = frac * stride;
        const ci = c | 0;
        const a1n = this.before[ci];
        const mLo = (n - a1n) | 0;
        const count = this.count[ci];
        if (mono && mLo >= lo && mLo + count <= hi) {
          const k0 = (a1n * stride + halfDense + ci) | 0;
          const io = this.dotIo;
          // On a table point (c = ci): one column, as on a table phase above.
          if (c === ci) columnSum(dense, k0, stride, x, mLo, count, io);
          if (c === ci && io[2] - io[2] === 0) y[o + i] = (stride / phases) * io[2];
          else {
            io[0] = c - ci;
            dotColumns(dense, k0, stride, x, mLo, count, io);
            y[o + i] = (stride / phases) * io[1];
          }
          cur.lastStretch = phases / stride;
        } else this.renderOne(out, o + i, stride);
      }
      cur.moveTo(pos + r);
      if (cur.wrapped) lo = cur.loopStart;
    }
  }

  /** Writes the one-row sum in dotIo[2] to y[oi] when finite, else the full two-row form on the table phase at k0, window x[m…]. */
  private finishRow(y: Float32Array, oi: number, k0: number, m: number): void {
    const io = this.dotIo;
    const a = io[2];
    if (a - a === 0) y[oi] = a;
    else {
      io[0] = 0;
      dotRowsSplit(this.table.phaseMajor, k0, this.table.taps, this.cur.sources[0], m, io);
      y[oi] = io[1];
    }
  }

  /** Fills before[ci] and count[ci] (window frames before the position, and in all) at `stride` for ci = 0…stride (stride too: frac·stride may round up to it). */
  private spans(stride: number): void {
    const halfDense = this.table.halfTaps * this.table.phases;
    for (let ci = 0; ci <= stride; ci++) {
      const a1n = ((halfDense - 1 - ci) / stride) | 0;
      this.before[ci] = a1n;
      this.count[ci] = (a1n + (halfDense + ci) / stride + 1) | 0;
    }
    this.spanStride = stride;
  }

  /** One output sample at the cursor by the general path (window gathered across edges and loop seams, any channels). */
  private renderOne(out: readonly Float32Array[], o: number, strideIn: number): void {
    const t = this.table;
    const chans = this.cur.channelsInUse;
    const n = Math.floor(this.cur.pos);
    const frac = this.cur.pos - n;
    let mLo: number;
    let count: number;
    let stride: number;
    let k0: number;
    let f: number;
    let scale: number;
    if (strideIn === t.phases) {
      const ph = frac * t.phases;
      const phi = Math.floor(ph);
      f = ph - phi;
      mLo = n - t.halfTaps + 1;
      count = t.taps;
      stride = 0;
      k0 = phi * t.taps;
      scale = 1;
      this.cur.lastStretch = 1;
    } else {
      stride = strideIn;
      const half = t.halfTaps * t.phases;
      const c = frac * stride;
      const i = Math.floor(c);
      f = c - i;
      const a1 = Math.floor((half - 1 - i) / stride);
      const a0 = Math.floor((half + i) / stride);
      mLo = n - a1;
      count = a1 + a0 + 1;
      k0 = a1 * stride + half + i;
      scale = stride / t.phases;
      this.cur.lastStretch = t.phases / stride;
    }
    const lo = this.cur.loop ? (this.cur.wrapped ? this.cur.loopStart : 0) : 0;
    const hi = this.cur.loop ? this.cur.loopEnd : this.cur.length;
    let useScratch = false;
    if (mLo < lo || mLo + count > hi) {
      if (!this.cur.gather(this.scratch, mLo, count)) {
        for (let c = 0; c < chans; c++) out[c][o] = 0;
        return;
      }
      useScratch = true;
    }
    const base = useScratch ? 0 : mLo;
    const io = this.dotIo;
    io[0] = f;
    if (chans === 1) {
      const x = useScratch ? this.scratch[0] : this.cur.sources[0];
      if (stride === 0) dotRows(t.phaseMajor, k0, t.taps, x, base, io);
      else dotStride(t.dense, k0, stride, x, base, count, io);
      out[0][o] = scale * io[1];
      return;
    }
    const w = this.weights;
    if (stride === 0) fillRows(w, t.phaseMajor, k0, t.taps, io);
    else fillStride(w, t.dense, k0, stride, count, io);
    for (let c = 0; c < chans; c++) {
      const x = useScratch ? this.scratch[c] : this.cur.sources[c];
      let acc = 0;
      for (let j = 0; j < count; j++) acc += w[j] * x[base + j];
      out[c][o] = scale * acc;
    }
  }
}
