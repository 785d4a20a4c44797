// The read state of a StreamReader: source channels, one-shot or loop region, fractional position and the last
// sanitised ratio, shared by its TypeScript and WebAssembly paths (wrapping as in J. O. Smith's bandlimited interpolation).
import { MAX_RATIO, MIN_RATIO } from './quality-tiers';

const EMPTY = new Float32Array(0);

/** Where and how a StreamReader reads its source; mutated in place, never allocates after construction. */
export class ReadCursor {
  /** Source channel arrays (unused slots hold an empty array). */
  readonly sources: Float32Array[];
  /** Channels of the current source (0…sources.length). */
  channelsInUse = 0;
  /** Source length, frames (the shortest channel's). */
  length = 0;
  /** Whether the region [loopStart, loopEnd) loops. */
  loop = false;
  /** Loop region start, frames. */
  loopStart = 0;
  /** Loop region end, frames, exclusive. */
  loopEnd = 0;
  /** loopEnd − loopStart, frames. */
  loopLength = 0;
  /** True once a loop has wrapped (frames before loopStart then read from the loop's end). */
  wrapped = false;
  // The three doubles below are declared with a double and given their real start values in the constructor: a field
  // first stored with a small integer and later with a double changes the layout of every cursor, which throws away
  // the optimised code of every method using it while V8 is still compiling (docs/allocation.md).
  /** Read position, source frames (fractional). */
  pos = 0.5;
  /** The last in-range ratio (replaces non-finite ones). */
  lastRatio = 0.5;
  /** Kernel stretch of the last output sample (≥ 1; sets how far past the end a one-shot still sounds). */
  lastStretch = 0.5;
  /** Ratios clamped or replaced, plus module stalls (StreamReader.clampCount). */
  clamps = 0;

  /** Holds up to `channels` (1…32) source channels. */
  constructor(channels: number) {
    this.sources = new Array<Float32Array>(channels).fill(EMPTY);
    this.pos = 0;
    this.lastRatio = 1;
    this.lastStretch = 1;
  }

  /** Clears channel slots from `count` on (they then read nothing). */
  clearFrom(count: number): void {
    for (let c = count; c < this.sources.length; c++) this.sources[c] = EMPTY;
  }

  /** Ratios handed to `sanitizeAt` in place (the ramp's two ends, or `sanitize`'s one). */
  readonly ratioIo = new Float64Array(2);

  /** `r` when it lies in MIN_RATIO…MAX_RATIO, else the nearest bound (or the last ratio when non-finite), counted in `clamps`. */
  sanitize(r: number): number {
    const q = this.ratioIo;
    q[0] = r;
    this.sanitizeAt(q, 0);
    return q[0];
  }

  /**
   * `sanitize` of q[k] in place: the render path's form, since V8 boxes a double passed to or returned from a call it
   * did not inline (docs/allocation.md).
   */
  sanitizeAt(q: Float64Array, k: number): void {
    const r = q[k];
    if (r >= MIN_RATIO && r <= MAX_RATIO) {
      this.lastRatio = r;
      return;
    }
    this.clamps++;
    if (r !== r || r === Infinity || r === -Infinity) {
      q[k] = this.lastRatio;
      return;
    }
    const c = r > MAX_RATIO ? MAX_RATIO : MIN_RATIO;
    this.lastRatio = c;
    q[k] = c;
  }

  /** Moves the position on by `r` source frames, wrapping inside a loop. */
  advance(r: number): void {
    this.moveTo(this.pos + r);
  }

  /** Sets the position to `p` source frames, reached by advancing: inside a loop, past its end wraps back by whole loop lengths. */
  moveTo(p: number): void {
    this.pos = p;
    this.wrapPos();
  }

  /** `moveTo(pos)`: wraps a position already stored in `pos` (the render path's form: no double crosses the call). */
  wrapPos(): void {
    if (this.loop && this.pos >= this.loopEnd) {
      let p = this.pos;
      while (p >= this.loopEnd) p -= this.loopLength;
      this.wrapped = true;
      this.pos = p;
    }
  }

  /** Source index for frame m after loop wrapping, or −1 for silence. */
  mapIndex(m: number): number {
    if (this.loop) {
      if (m >= this.loopEnd) m = this.loopStart + ((m - this.loopStart) % this.loopLength);
      else if (m < this.loopStart && this.wrapped) m = this.loopEnd - 1 - ((this.loopStart - 1 - m) % this.loopLength);
    }
    return m >= 0 && m < this.length ? m : -1;
  }

  /** Writes `frames` samples of the mapped source at ratio 1 to out[c][o…] from an integer position, advancing it. */
  copyThrough(out: readonly Float32Array[], o: number, frames: number): void {
    const chans = this.channelsInUse;
    for (let i = 0; i < frames; i++) {
      const m = this.mapIndex(this.pos);
      for (let c = 0; c < chans; c++) out[c][o + i] = m < 0 ? 0 : this.sources[c][m];
      this.advance(1);
    }
    this.lastStretch = 1;
  }

  /** Fills scratch[c][0…count) with the window mLo…mLo+count−1 (wrapped or silent); returns false when it is all silence. */
  gather(scratch: readonly Float32Array[], mLo: number, count: number): boolean {
    let any = false;
    const chans = this.channelsInUse;
    for (let j = 0; j < count; j++) {
      const m = this.mapIndex(mLo + j);
      if (m >= 0) any = true;
      for (let c = 0; c < chans; c++) scratch[c][j] = m < 0 ? 0 : this.sources[c][m];
    }
    return any;
  }
}
