// The tone stage of a voice: the dilation tone (and air absorption) as an RBJ cookbook low-pass (biquad, Q 1/√2),
// cutoff smoothed in log frequency and set per 32-frame sub-block; bypassed when open, crossfaded over one block on a change;
// a stereo block in WebAssembly module memory is filtered there (wasm/lowpass.ts, the same samples).
import { BiquadLowpass, LP_SETS, OnePoleSmoother, type WasmKernel } from '../dsp';
import { OPEN_CUTOFF_HZ } from '../tuning';
import type { Hz, Seconds } from '../units';

/** Frames per dilation-tone coefficient update. */
export const TONE_SUB_BLOCK = 32;
/** Q of the dilation-tone low-pass (Butterworth, 1/√2). */
export const TONE_Q = Math.SQRT1_2;

const OPEN_LOG2 = Math.log2(OPEN_CUTOFF_HZ);

/** A voice's low-pass, its smoothed cutoff and its bypass state; allocation-free per block. */
export class VoiceTone {
  /** The two-channel low-pass. */
  readonly filter = new BiquadLowpass({ channels: 2 });
  /** Smoothed cutoff, log2 Hz. */
  readonly cutoffLog2: OnePoleSmoother;
  /** Whether the low-pass is in the path (false: bypassed, the target is open and the cutoff has arrived). */
  wet = false;
  /** The air-absorption low-pass has engaged for this voice (it then stays engaged for the voice's life). */
  airEngaged = false;
  private target = 0.5;
  private memoHz = NaN;
  /** Smoothed cutoff (log2 Hz) the filter's coefficients were last designed for (NaN: none yet). */
  private designed = NaN;
  /** The block's filtering is staged in the module and left to the mix stage (`mixPending`). */
  private pending = false;

  /** An open, bypassed tone with cutoff smoothing `cutoffSeconds` (s) at `sampleRate` (Hz). */
  constructor(sampleRate: Hz, cutoffSeconds: Seconds) {
    this.filter.design[1] = TONE_Q;
    this.filter.design[2] = sampleRate;
    this.cutoffLog2 = new OnePoleSmoother({ timeConstantSeconds: cutoffSeconds, sampleRate, initial: OPEN_LOG2 });
  }

  /** Sets the smoothing time constant, s. */
  setSmoothing(cutoffSeconds: Seconds): void {
    this.cutoffLog2.setTimeConstant(cutoffSeconds);
  }

  /** Smoothed cutoff now, Hz (OPEN_CUTOFF_HZ when bypassed). */
  get currentCutoff(): Hz {
    return this.wet ? Math.pow(2, this.cutoffLog2.value) : OPEN_CUTOFF_HZ;
  }

  /** Reads the block's target cutoff from `t.cutoffHz`, Hz (the logarithm is kept while it repeats); the object, not the double, crosses the call: V8 boxes a double passed to a call it does not inline. */
  aim(t: { readonly cutoffHz: Hz }): void {
    const cutoffHz = t.cutoffHz;
    if (cutoffHz !== this.memoHz) {
      this.memoHz = cutoffHz;
      this.target = Math.log2(cutoffHz);
    }
  }

  /** Jumps to the target last aimed at, with a cleared filter (a voice's first block). */
  jump(): void {
    this.cutoffLog2.reset(this.target);
    this.wet = this.target < OPEN_LOG2;
    this.filter.reset();
  }

  /** Clears the filter's state (after a non-finite input, or when a voice becomes audible again). */
  clear(): void {
    this.filter.reset();
  }

  /** Advances the cutoff over `frames` without filtering (held, silent or virtual voices). */
  idle(frames: number): void {
    const sm = this.cutoffLog2;
    sm.target = this.target;
    sm.step(frames);
    // A field store, not sm.reset(target): see process.
    if (Math.abs(sm.value - this.target) < 1e-4) sm.value = this.target;
  }

  /**
   * Filters `frames` of `bufs` in place; `dry` (as many channels, ≥ frames) holds the unfiltered copy for a crossfade.
   * With `wasm` non-null (`bufs` then views of its memory) a stereo block is filtered in the module (the same samples);
   * with `fuse` too, a block filtered in one call and needing no crossfade is only staged there, and the mix stage
   * filters it as it mixes (`pendingIn`, `mixPending`), which must follow.
   */
  process(bufs: readonly Float32Array[], dry: readonly Float32Array[], frames: number, wasm: WasmKernel | null = null, fuse = false): void {
    // Nothing staged from an earlier block can carry over (a block cut short by an exception never reached its mix).
    this.pending = false;
    const target = this.target;
    const wasWet = this.wet;
    const before = this.cutoffLog2.value;
    const nowWet = !(target >= OPEN_LOG2 && (before >= OPEN_LOG2 || target - before < 1e-3));
    this.wet = nowWet;
    if (!wasWet && !nowWet) {
      this.idle(frames);
      return;
    }
    const chans = bufs.length;
    const changing = wasWet !== nowWet;
    if (changing) for (let ch = 0; ch < chans; ch++) copy(bufs[ch], dry[ch], frames);
    if (!wasWet) this.filter.reset();
    const sm = this.cutoffLog2;
    const design = this.filter.design;
    const resident = chans === 2 ? wasm : null;
    // In the module: sub-blocks from `start` staged as sets 0…set − 1, filtered in one call per LP_SETS of them.
    let start = 0;
    let set = 0;
    sm.target = target;
    for (let off = 0; off < frames; off += TONE_SUB_BLOCK) {
      const n = frames - off < TONE_SUB_BLOCK ? frames - off : TONE_SUB_BLOCK;
      sm.step(n);
      // Arrived: snap to the target (finite here, so this is reset(target)). A field store, not a call: when V8 compiled
      // this before `reset` had type feedback of its own, it called it, boxing the double on every sub-block for the
      // rest of the run (128 B/block in this scene; docs/allocation.md).
      if (Math.abs(sm.value - target) < 1e-4) sm.value = target;
      // The same cutoff gives the same coefficients: design only when it moved (an arrived cutoff stays put).
      const log2 = sm.value;
      if (log2 !== this.designed) {
        this.designed = log2;
        design[0] = Math.pow(2, log2);
        this.filter.applyDesign();
      }
      if (resident === null) this.filter.process(bufs, off, n);
      else {
        this.filter.stageResident(resident, set++);
        if (fuse && start === 0 && off + n === frames && !changing) this.pending = true;
        else if (set === LP_SETS || off + n === frames) {
          this.filter.processResident(resident, bufs[0].byteOffset + 4 * start, bufs[1].byteOffset + 4 * start, off + n - start, TONE_SUB_BLOCK);
          start = off + n;
          set = 0;
        }
      }
    }
    if (changing) crossfade(bufs, dry, frames, nowWet);
  }

  /** Whether the last `process` left its filtering to the mix stage: the tone when so, else null. */
  pendingIn(): VoiceTone | null {
    return this.pending ? this : null;
  }

  /**
   * Filters the block `process` staged (channels at byte addresses x0 and x1 of `wasm`'s memory, `frames`) and mixes it
   * into the bus at mixL and mixR with the gains in `wasm.mixGains`; false when a filtered sample was not finite.
   */
  mixPending(wasm: WasmKernel, x0: number, x1: number, mixL: number, mixR: number, frames: number): boolean {
    this.pending = false;
    return this.filter.processResidentMix(wasm, x0, x1, mixL, mixR, frames, TONE_SUB_BLOCK);
  }
}

/** Crossfades over the block from dry to filtered (`toWet`) or from filtered to dry, in place in `bufs`. */
function crossfade(bufs: readonly Float32Array[], dry: readonly Float32Array[], frames: number, toWet: boolean): void {
  for (let ch = 0; ch < bufs.length; ch++) {
    const x = bufs[ch];
    const d = dry[ch];
    for (let i = 0; i < frames; i++) {
      const w = (i + 1) / frames;
      x[i] = toWet ? d[i] + (x[i] - d[i]) * w : x[i] + (d[i] - x[i]) * w;
    }
  }
}

function copy(from: Float32Array, to: Float32Array, frames: number): void {
  for (let i = 0; i < frames; i++) to[i] = from[i];
}
