// Real-time time-scale modification by WSOLA (W. Verhelst and M. Roelands, ICASSP 1993; docs/references.md §12):
// Hann grains at 50 % overlap, each placed within ±tolerance of its nominal source position where it best continues
// the previous grain; grains are read by the band-limited StreamReader, so a pitch ratio (and Doppler) is resampling.
import { StreamReader, MAX_RATIO, type KernelPreference, type KernelTable, type StreamSourceOptions } from '../dsp';
import type { Hz, Seconds } from '../units';
import { SimilaritySearch } from './similarity-search';

/** Construction options of a StretchReader. */
export interface StretchReaderOptions {
  /** Kernel table of the grain readers (e.g. `KernelTable.forTier('standard')`). */
  table: KernelTable;
  /** Most source channels (1…2 are mixed for the search; all are rendered). */
  channels: number;
  /** Output sample rate, Hz. */
  sampleRate: Hz;
  /** Grain length, s (0.01…0.2, default 0.04); the hop is half of it. */
  grainSeconds?: Seconds;
  /** Largest offset from the nominal position the search may take, s (0…0.05, default 0.01). */
  toleranceSeconds?: Seconds;
  /** Inner loop of the grain readers (see StreamReaderOptions). */
  kernel?: KernelPreference;
}

/** Frozen defaults of StretchReaderOptions. */
export const stretchReaderDefaults = Object.freeze({ grainSeconds: 0.04, toleranceSeconds: 0.01 });

/**
 * Reads a source at a read speed (source frames per output frame, 0 = held) with its pitch set apart by a pitch ratio
 * (the playback ratio of the grains' content); creates no objects after construction; doubles reach its bodies in fields (docs/allocation.md).
 */
export class StretchReader {
  /** Hop between grain starts, output frames (half a grain). */
  readonly hopFrames: number;
  /** Search tolerance, source frames. */
  readonly toleranceFrames: number;
  private readonly readers: [StreamReader, StreamReader];
  private readonly grains: [Float32Array[], Float32Array[]];
  private readonly hann: Float32Array;
  private readonly search: SimilaritySearch;
  private sources: Float32Array[] = [];
  private channelsInUse = 0;
  private length = 0;
  private loop = false;
  private loopStart = 0;
  private loopEnd = 0;
  private wrapped = false;
  private pos = 0;
  private newer = 0;
  private phase = 0;
  private clamps = 0;
  // Doubles handed to the bodies of read, skip, startGrain and advance in fields, not as arguments: V8 boxes a double
  // passed to or returned from a call it does not inline (docs/allocation.md).
  private speedStart = 0.5;
  private speedEnd = 0.5;
  private pitchStart = 0.5;
  private pitchEnd = 0.5;
  private grainSpeed = 0.5;
  private grainPitch = 0.5;
  private step = 0.5;
  /** MAX_RATIO as a field: a module constant merged with a computed double made V8 box the double. */
  private readonly maxRatio = MAX_RATIO;

  /** Allocates two grain readers, their buffers, the window and the search buffers. */
  constructor(options: StretchReaderOptions) {
    const sr = options.sampleRate;
    const grain = clamp(options.grainSeconds ?? stretchReaderDefaults.grainSeconds, 0.01, 0.2);
    const tol = clamp(options.toleranceSeconds ?? stretchReaderDefaults.toleranceSeconds, 0, 0.05);
    this.hopFrames = Math.max(16, Math.round((grain * sr) / 2));
    this.toleranceFrames = Math.round(tol * sr);
    const channels = Math.max(1, Math.min(32, Math.floor(options.channels)));
    const mk = (): StreamReader => new StreamReader({ table: options.table, channels, kernel: options.kernel });
    this.readers = [mk(), mk()];
    const bufs = (): Float32Array[] => Array.from({ length: channels }, () => new Float32Array(this.hopFrames));
    this.grains = [bufs(), bufs()];
    const n = 2 * this.hopFrames;
    this.hann = new Float32Array(n);
    for (let j = 0; j < n; j++) this.hann[j] = 0.5 - 0.5 * Math.cos((2 * Math.PI * j) / n);
    this.search = new SimilaritySearch(this.hopFrames, Math.max(1, this.toleranceFrames), sr);
  }

  /** Switches the grain readers' kernel table. */
  setTable(table: KernelTable): void {
    this.readers[0].setTable(table);
    this.readers[1].setTable(table);
  }

  /** Sets the source and rewinds to `startFrame` (as StreamReader.setSource); no allocation. */
  setSource(channels: readonly Float32Array[], options?: StreamSourceOptions): void {
    this.readers[0].setSource(channels, options);
    this.readers[1].setSource(channels, options);
    this.sources.length = 0;
    let len = channels.length > 0 ? channels[0].length : 0;
    const count = Math.min(channels.length, this.grains[0].length);
    for (let c = 0; c < count; c++) len = Math.min(len, channels[c].length);
    for (let c = 0; c < count && c < 2; c++) this.sources.push(channels[c]);
    this.channelsInUse = count;
    this.length = len;
    this.loop = options?.loop === true && len > 0;
    let ls = Math.floor(options?.loopStart ?? 0);
    let le = Math.floor(options?.loopEnd ?? len);
    if (!(ls >= 0 && le <= len && le > ls)) {
      ls = 0;
      le = len;
    }
    this.loopStart = ls;
    this.loopEnd = le;
    this.wrapped = false;
    const start = options?.startFrame ?? 0;
    this.pos = Number.isFinite(start) ? start : 0;
    this.restart();
  }

  /** The voice's position in source frames: the integral of the read speed (grains sit within ±tolerance of it). */
  get position(): number {
    return this.pos;
  }

  /** Moves the position to `frame` (source frames; non-finite → 0) and starts a fresh grain there at the next read (a seek). */
  seek(frame: number): void {
    this.pos = Number.isFinite(frame) ? frame : 0;
    this.restart();
  }

  /** Speeds or pitch ratios replaced or clamped on the audio path (non-finite or out of range), plus the readers'. */
  get clampCount(): number {
    return this.clamps + this.readers[0].clampCount + this.readers[1].clampCount;
  }

  /** True once a one-shot's position has passed its end and both grains have run out. */
  get finished(): boolean {
    return !this.loop && this.pos >= this.length && this.readers[0].finished && this.readers[1].finished;
  }

  /** Source frames read ahead of the position: half a grain at the pitch ratio plus the tolerance (no output delay). */
  lookAheadFrames(pitchRatio: number): number {
    return Math.ceil(this.hopFrames * pitchRatio) + this.toleranceFrames;
  }

  /**
   * Writes `frames` samples to out[c][outOffset…] for each source channel. The read speed ramps linearly from
   * speedStart to speedEnd (0…4, 0 = held: the grains keep sounding around a still position), the pitch ratio from
   * pitchStart to pitchEnd (MIN_RATIO…4, 1 = pitch kept).
   */
  read(out: readonly Float32Array[], outOffset: number, frames: number, speedStart: number, speedEnd: number, pitchStart: number, pitchEnd: number): void {
    this.speedStart = speedStart;
    this.speedEnd = speedEnd;
    this.pitchStart = pitchStart;
    this.pitchEnd = pitchEnd;
    this.readBlock(out, outOffset, frames);
  }

  /** The body of `read`, with the speed and pitch ramps in fields. */
  private readBlock(out: readonly Float32Array[], outOffset: number, frames: number): void {
    this.clampRamps();
    const ss = this.speedStart;
    const ds = this.speedEnd - ss;
    const ps = this.pitchStart;
    const dp = this.pitchEnd - ps;
    const hop = this.hopFrames;
    const w = this.hann;
    const chans = Math.min(out.length, this.channelsInUse);
    let done = 0;
    while (done < frames) {
      if (this.phase >= hop) {
        this.grainSpeed = ss + (ds * done) / frames;
        this.grainPitch = ps + (dp * done) / frames;
        this.startGrain();
      }
      const n = Math.min(frames - done, hop - this.phase);
      const p0 = ps + (dp * done) / frames;
      const p1 = ps + (dp * (done + n)) / frames;
      const gNew = this.grains[this.newer];
      const gOld = this.grains[1 - this.newer];
      this.readers[this.newer].read(gNew, 0, n, p0, p1);
      this.readers[1 - this.newer].read(gOld, 0, n, p0, p1);
      const ph = this.phase;
      for (let c = 0; c < chans; c++) {
        const y = out[c];
        const a = gNew[c];
        const b = gOld[c];
        const o = outOffset + done;
        for (let i = 0; i < n; i++) y[o + i] = w[ph + i] * a[i] + w[ph + hop + i] * b[i];
      }
      this.step = n * ss + (ds / frames) * ((n * (2 * done + n - 1)) / 2);
      this.advance();
      this.phase += n;
      done += n;
    }
  }

  /** Advances the position as `read` would, without output (virtual voices); the next read starts a fresh grain. */
  skip(frames: number, speedStart: number, speedEnd: number): void {
    this.speedStart = speedStart;
    this.speedEnd = speedEnd;
    this.skipBlock(frames);
  }

  /** The body of `skip`. */
  private skipBlock(frames: number): void {
    this.pitchStart = 1;
    this.pitchEnd = 1;
    this.clampRamps();
    const ss = this.speedStart;
    const se = this.speedEnd;
    this.step = frames * ss + ((se - ss) * (frames - 1)) / 2;
    this.advance();
    this.restart();
  }

  /** Clamps the ramps' ends in place (counted): speeds to 0…MAX_RATIO, pitch ratios to 1/64…MAX_RATIO (NaN → 1). */
  private clampRamps(): void {
    const max = this.maxRatio;
    const s0 = this.speedStart;
    const s1 = this.speedEnd;
    const p0 = this.pitchStart;
    const p1 = this.pitchEnd;
    if (!(s0 >= 0 && s0 <= max)) {
      this.clamps++;
      this.speedStart = s0 > max ? max : 0;
    }
    if (!(s1 >= 0 && s1 <= max)) {
      this.clamps++;
      this.speedEnd = s1 > max ? max : 0;
    }
    if (!(p0 >= 1 / 64 && p0 <= max)) {
      this.clamps++;
      this.pitchStart = p0 > max ? max : p0 >= 0 ? 1 / 64 : 1;
    }
    if (!(p1 >= 1 / 64 && p1 <= max)) {
      this.clamps++;
      this.pitchEnd = p1 > max ? max : p1 >= 0 ? 1 / 64 : 1;
    }
  }

  /** Positions the continuation reader at the current position and asks for a new grain at the next read. */
  private restart(): void {
    this.newer = 0;
    this.readers[0].position = this.pos;
    this.phase = this.hopFrames;
  }

  /** Hop boundary: the finished grain's reader starts the next grain where the search puts it. */
  private startGrain(): void {
    const speed = this.grainSpeed;
    const pitch = this.grainPitch;
    const hop = this.hopFrames;
    const cont = this.readers[this.newer].position;
    const next = 1 - this.newer;
    this.phase = 0;
    this.newer = next;
    if (!this.loop && this.pos >= this.length) {
      // Past a one-shot's end: the new grain reads silence.
      this.readers[next].position = this.length + 2 * hop * MAX_RATIO + 1024;
      return;
    }
    // Nominal start: the grain's centre (one hop ahead) at the extrapolated position, minus half a grain of content.
    let nominal = this.pos + speed * hop - hop * pitch;
    if (this.loop && this.wrapped && nominal < this.loopStart) nominal += this.loopEnd - this.loopStart;
    const tol = this.toleranceFrames;
    let offset = 0;
    if (tol > 0 && this.sources.length > 0) {
      const compare = Math.min(this.search.maxCompare, Math.max(8, Math.round(hop * pitch)));
      this.fill(this.search.target, Math.round(cont), compare);
      this.fill(this.search.region, Math.round(nominal) - tol, 2 * tol + compare + this.search.decimation);
      offset = this.search.best(compare, tol);
    }
    // At pitch ratio 1 the grain starts on a whole frame: its samples are copied, not interpolated (±0.5 frame).
    this.readers[next].position = pitch === 1 ? Math.round(nominal) + offset : nominal + offset;
  }

  /** Copies `count` source frames from `start` (channels mixed, loop-wrapped or silent beyond the ends) into `dst`. */
  private fill(dst: Float32Array, start: number, count: number): void {
    const a = this.sources[0];
    const b = this.sources.length > 1 ? this.sources[1] : null;
    const span = this.loopEnd - this.loopStart;
    for (let i = 0; i < count; i++) {
      let k = start + i;
      if (this.loop) {
        if (k >= this.loopEnd) k = this.loopStart + ((k - this.loopStart) % span);
        else if (k < 0 && this.wrapped) k += span;
      }
      dst[i] = k >= 0 && k < this.length ? (b === null ? a[k] : a[k] + b[k]) : 0;
    }
  }

  /** Moves the position by `step` source frames (loop-wrapped). */
  private advance(): void {
    let p = this.pos + this.step;
    if (this.loop && p >= this.loopEnd) {
      p = this.loopStart + ((p - this.loopStart) % (this.loopEnd - this.loopStart));
      this.wrapped = true;
    }
    this.pos = p;
  }
}

function clamp(x: number, lo: number, hi: number): number {
  return x >= lo ? (x <= hi ? x : hi) : lo;
}
