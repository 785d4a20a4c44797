// One voice of the engine: smoothing of its targets (ratio in cents, cutoff in log frequency, gains in dB,
// setTargetAtTime-style one-pole smoothing), band-limited resampling, dilation-tone low-pass and the mix.
import { BiquadLowpass, OnePoleSmoother, KernelTable, StreamReader, MAX_RATIO, MIN_RATIO, type KernelPreference, type WasmKernel } from '../dsp';
import { createVoiceTargets, type VoiceTargets } from '../dilation';
import { OPEN_CUTOFF_HZ } from '../tuning';
import type { Hz, Seconds } from '../units';
import type { StretchStage } from './stretch-stage';
import type { PropagationStage } from './propagation-stage';

/** Voice state: the slot is free. */
export const VOICE_FREE = 0;
/** Voice state: playing (fading in or sustained). */
export const VOICE_PLAYING = 1;
/** Voice state: fading out after a stop or a steal; the slot frees at the end of the fade. */
export const VOICE_RELEASING = 2;

/** Below this linear gain (−90 dB) a voice becomes virtual; it comes back above RETURN_GAIN (−84 dB). */
export const VIRTUAL_GAIN = Math.pow(10, -90 / 20);
/** Linear gain (−84 dB) above which a virtual voice is rendered again. */
export const RETURN_GAIN = Math.pow(10, -84 / 20);
/** Fade used when a frozen group (time scale 0) stops and resumes, s. */
export const FREEZE_FADE_SECONDS: Seconds = 0.02;
/** Frames per dilation-tone coefficient update. */
export const TONE_SUB_BLOCK = 32;
/** Q of the dilation-tone low-pass (Butterworth, 1/√2). */
export const TONE_Q = Math.SQRT1_2;

const OPEN_LOG2 = Math.log2(OPEN_CUTOFF_HZ);
const DB_FLOOR = -120;

/** Linear gain → dB with a −120 dB floor. */
export function gainToDbFloor(g: number): number {
  return g > 1e-6 ? 20 * Math.log10(g) : DB_FLOOR;
}

/** dB → linear gain, 0 at the −120 dB floor. */
export function dbToGainFloor(db: number): number {
  return db <= DB_FLOOR + 0.01 ? 0 : Math.pow(10, db / 20);
}

/** Target audibility of mapped targets: linear gain of the louder channel, 0…16. */
export function targetAudibility(t: VoiceTargets): number {
  const l = t.gain * t.left;
  const r = t.gain * t.right;
  return l > r ? l : r;
}

/** Scratch buffers shared by all voices of an engine (one voice renders at a time). */
export interface VoiceScratch {
  /** Resampled channels (2 × maxBlockFrames). */
  stereo: Float32Array[];
  /** Only the first channel of `stereo`, for mono sounds. */
  mono: Float32Array[];
  /** Copy of the unfiltered signal for the bypass crossfade (2 × maxBlockFrames). */
  dry: Float32Array[];
  /** The WebAssembly kernel when `stereo` and the mix bus are views of its memory (the mix then runs in the module), else null. */
  wasm: WasmKernel | null;
  /** Per-sample read ratios of a propagating voice (maxBlockFrames). */
  ratios: Float32Array;
  /** The engine's propagation stage (fills and counts the ratios), or null. */
  stage: PropagationStage | null;
}

/** A voice slot: state, resampler, filter and smoothers, all allocated once. */
export class Voice {
  state = VOICE_FREE;
  generation = 0;
  sound = -1;
  channels = 1;
  rateFactor = 1;
  group = '';
  followsTime = true;
  priority = 0;
  gain = 1;
  ratio = 1;
  sourceId = -1;
  sourceSlot = -1;
  /** Start order, for deterministic stealing among equals. */
  sequence = 0;
  virtual = false;
  fresh = true;
  filterWet = false;
  env = 0;
  envTarget = 1;
  /** Envelope change per sample while fading in or resuming, and while releasing. */
  attackStep = 1;
  releaseStep = 1;
  /** Envelope step per sample of the freeze fade (time scale 0) and of the resume after it. */
  readonly freezeStep: number;
  /** Set while frozen, until the resume fade has completed. */
  thawing = false;
  /** Held by a pause or a pending seek (set by the engine each block): fades out and holds like a frozen voice. */
  held = false;
  /** Slot index in the engine's pool. */
  index = 0;
  /** Propagation model: the read follows the emission time (delay and emission-time Doppler). */
  propagating = false;
  /** The air-absorption low-pass has engaged for this voice (it then stays engaged). */
  airEngaged = false;
  /** Whether the sound has reached the listener (propagating voices are silent and hold until it does). */
  arrived = true;
  /** Engine time the voice started (its sound's emission began), s. */
  startTime: Seconds = 0;
  /** Game-clock Doppler factor at the block's start and end (propagating voices). */
  dopplerStart = 1;
  dopplerEnd = 1;
  /** Mean Doppler factor over the block (NaN: unknown, ramp linearly). */
  dopplerMean = NaN;
  /** Frames of the arrival block before the sound arrives, or emission frames the arrival jumped over (a Mach cone). */
  arrivalFrames = 0;
  arrivalSkipFrames = 0;
  readonly targets: VoiceTargets = createVoiceTargets();
  readonly reader: StreamReader;
  /** The time-stretch stage reading in place of `reader` ('stretch' groups), or null (tape-style). */
  stretch: StretchStage | null = null;
  readonly filter = new BiquadLowpass({ channels: 2 });
  readonly ratioCents: OnePoleSmoother;
  readonly dopplerCents: OnePoleSmoother;
  readonly cutoffLog2: OnePoleSmoother;
  readonly leftDb: OnePoleSmoother;
  readonly rightDb: OnePoleSmoother;
  private startRatio = 1;
  private startLeft = 0;
  private startRight = 0;
  // Last inputs and results of the per-block logarithms and powers (targets often repeat from block to block).
  private memoRatio = NaN;
  private memoDoppler = NaN;
  private memoRatioCents = 0;
  private memoDopplerCents = 0;
  private memoCutoffHz = NaN;
  private memoCutoffLog2 = 0;
  private memoLeft = NaN;
  private memoLeftDb = 0;
  private memoRight = NaN;
  private memoRightDb = 0;
  private memoLeftEndDb = NaN;
  private memoLeftEnd = 0;
  private memoRightEndDb = NaN;
  private memoRightEnd = 0;
  private readonly sampleRate: Hz;

  /** Allocates the voice's resampler (2 channels), filter and smoothers. */
  constructor(table: KernelTable, sampleRate: Hz, smoothing: { ratio: Seconds; doppler: Seconds; cutoff: Seconds; gain: Seconds }, kernel: KernelPreference = 'auto') {
    this.sampleRate = sampleRate;
    this.freezeStep = 1 / (FREEZE_FADE_SECONDS * sampleRate);
    this.reader = new StreamReader({ table, channels: 2, kernel });
    this.ratioCents = new OnePoleSmoother({ timeConstantSeconds: smoothing.ratio, sampleRate });
    this.dopplerCents = new OnePoleSmoother({ timeConstantSeconds: smoothing.doppler, sampleRate });
    this.cutoffLog2 = new OnePoleSmoother({ timeConstantSeconds: smoothing.cutoff, sampleRate, initial: OPEN_LOG2 });
    this.leftDb = new OnePoleSmoother({ timeConstantSeconds: smoothing.gain, sampleRate, initial: DB_FLOOR });
    this.rightDb = new OnePoleSmoother({ timeConstantSeconds: smoothing.gain, sampleRate, initial: DB_FLOOR });
  }

  /** Sets the smoothing time constants (s). */
  setSmoothing(smoothing: { ratio: Seconds; doppler: Seconds; cutoff: Seconds; gain: Seconds }): void {
    this.ratioCents.setTimeConstant(smoothing.ratio);
    this.dopplerCents.setTimeConstant(smoothing.doppler);
    this.cutoffLog2.setTimeConstant(smoothing.cutoff);
    this.leftDb.setTimeConstant(smoothing.gain);
    this.rightDb.setTimeConstant(smoothing.gain);
  }

  /** Fade step per sample for a fade of `seconds` (0 = immediate). */
  fadeStep(seconds: Seconds): number {
    return seconds > 0 && seconds < Infinity ? 1 / (seconds * this.sampleRate) : 1;
  }

  /** Target audibility (linear, the louder channel) from the last mapped targets. */
  get audibility(): number {
    return targetAudibility(this.targets);
  }

  /** Current smoothed playback ratio. */
  get currentRatio(): number {
    return this.startRatio;
  }

  /** Current smoothed cutoff in Hz (OPEN_CUTOFF_HZ when bypassed). */
  get currentCutoff(): Hz {
    return this.filterWet ? Math.pow(2, this.cutoffLog2.value) : OPEN_CUTOFF_HZ;
  }

  /**
   * Renders one block of `frames` (≤ scratch length) after `targets` were mapped, mixing into mix[0]/mix[1] from `offset`.
   * Returns false when the voice has ended (released to silence or a finished one-shot) and should be freed.
   */
  render(mixL: Float32Array, mixR: Float32Array, offset: number, frames: number, scratch: VoiceScratch): boolean {
    // Not yet arrived (propagation delay, or outside a Mach cone): silent, read head at the start.
    if (!this.arrived) return this.state !== VOICE_RELEASING;
    const t = this.targets;
    const frozen = (t.frozen === true && this.followsTime) || this.held;
    if (this.state === VOICE_PLAYING) {
      this.envTarget = frozen ? 0 : 1;
      if (frozen) this.thawing = true;
    }
    if (t.ratio !== this.memoRatio || t.doppler !== this.memoDoppler) {
      this.memoRatio = t.ratio;
      this.memoDoppler = t.doppler;
      this.memoRatioCents = 1200 * Math.log2(t.ratio / t.doppler);
      this.memoDopplerCents = 1200 * Math.log2(t.doppler);
    }
    if (t.cutoffHz !== this.memoCutoffHz) {
      this.memoCutoffHz = t.cutoffHz;
      this.memoCutoffLog2 = Math.log2(t.cutoffHz);
    }
    const gl = t.gain * t.left;
    const gr = t.gain * t.right;
    if (gl !== this.memoLeft) {
      this.memoLeft = gl;
      this.memoLeftDb = gainToDbFloor(gl);
    }
    if (gr !== this.memoRight) {
      this.memoRight = gr;
      this.memoRightDb = gainToDbFloor(gr);
    }
    const ratioTarget = this.memoRatioCents;
    const dopplerTarget = this.memoDopplerCents;
    const cutoffTarget = this.memoCutoffLog2;
    const leftTarget = this.memoLeftDb;
    const rightTarget = this.memoRightDb;
    if (this.fresh) {
      this.fresh = false;
      this.ratioCents.reset(ratioTarget);
      this.dopplerCents.reset(dopplerTarget);
      this.cutoffLog2.reset(cutoffTarget);
      this.leftDb.reset(leftTarget);
      this.rightDb.reset(rightTarget);
      this.startRatio = clampRatio(t.ratio);
      this.startLeft = dbToGainFloor(leftTarget);
      this.startRight = dbToGainFloor(rightTarget);
      this.filterWet = cutoffTarget < OPEN_LOG2;
      this.filter.reset();
    }
    if (this.thawing && !frozen && this.env === 0) {
      // Resuming from a hold: start at the current pitch (masked by the resume fade) rather than gliding up from ~0.
      this.ratioCents.reset(ratioTarget);
      this.dopplerCents.reset(dopplerTarget);
      this.startRatio = clampRatio(t.ratio);
    }
    const rc = this.ratioCents.advance(ratioTarget, frames);
    const dc = this.dopplerCents.advance(dopplerTarget, frames);
    const ratioEnd = rc === ratioTarget && dc === dopplerTarget ? clampRatio(t.ratio) : clampRatio(Math.pow(2, (rc + dc) / 1200));
    const leftEndDb = this.leftDb.advance(leftTarget, frames);
    const rightEndDb = this.rightDb.advance(rightTarget, frames);
    if (leftEndDb !== this.memoLeftEndDb) {
      this.memoLeftEndDb = leftEndDb;
      this.memoLeftEnd = dbToGainFloor(leftEndDb);
    }
    if (rightEndDb !== this.memoRightEndDb) {
      this.memoRightEndDb = rightEndDb;
      this.memoRightEnd = dbToGainFloor(rightEndDb);
    }
    const leftEnd = this.memoLeftEnd;
    const rightEnd = this.memoRightEnd;
    const envStart = this.env;
    const rising = this.envTarget > envStart;
    const step = (rising ? (this.thawing ? this.freezeStep : this.attackStep) : this.state === VOICE_RELEASING ? this.releaseStep : this.freezeStep) * frames;
    const envEnd = rising ? Math.min(this.envTarget, envStart + step) : Math.max(this.envTarget, envStart - step);
    this.env = envEnd;
    if (envEnd === 1) this.thawing = false;
    const ratioStart = this.startRatio;
    const leftStart = this.startLeft;
    const rightStart = this.startRight;
    this.startRatio = ratioEnd;
    this.startLeft = leftEnd;
    this.startRight = rightEnd;

    let advance = 0;
    const ratios = scratch.ratios;
    const silentFrames = this.arrivalFrames;
    if (this.propagating && scratch.stage !== null) {
      advance = scratch.stage.fillRatios(ratios, frames, ratioStart, ratioEnd, this.dopplerStart, this.dopplerEnd, this.dopplerMean);
      this.arrive(ratios);
    }
    if (envStart === 0 && envEnd === 0) {
      // Held (frozen group) or silent: the read head stays where it is.
      if (this.state === VOICE_RELEASING) return false;
      this.advanceCutoff(cutoffTarget, frames);
      return true;
    }
    const target = gl > gr ? gl : gr;
    const smoothed = leftEnd > rightEnd ? leftEnd : rightEnd;
    if (!this.virtual && target < VIRTUAL_GAIN && smoothed < VIRTUAL_GAIN) this.virtual = true;
    else if (this.virtual && target > RETURN_GAIN) {
      this.virtual = false;
      this.filter.reset();
    }
    if (this.virtual) {
      if (this.stretch !== null) this.stretch.skip(frames, ratioStart, ratioEnd, t, this.dopplerCents.value);
      else if (this.propagating) this.reader.position = this.reader.position + advance;
      else this.reader.skip(frames, ratioStart, ratioEnd);
      this.advanceCutoff(cutoffTarget, frames);
      return this.alive(envEnd);
    }
    const bufs = this.channels === 1 ? scratch.mono : scratch.stereo;
    if (this.stretch !== null) this.stretch.read(bufs, frames, ratioStart, ratioEnd, t, this.dopplerCents.value);
    else if (this.propagating) {
      this.reader.readRatios(bufs, 0, frames, ratios, 0);
      // Before the arrival sample nothing has reached the listener yet.
      for (let c = 0; c < bufs.length; c++) bufs[c].fill(0, 0, silentFrames);
    } else this.reader.read(bufs, 0, frames, ratioStart, ratioEnd);
    this.tone(bufs, scratch.dry, frames, cutoffTarget);

    const x0 = bufs[0];
    const x1 = this.channels === 1 ? x0 : bufs[1];
    const gl0 = leftStart * envStart;
    const gr0 = rightStart * envStart;
    const dgl = (leftEnd * envEnd - gl0) / frames;
    const dgr = (rightEnd * envEnd - gr0) / frames;
    const k = scratch.wasm;
    if (k !== null) {
      // The same mix in the module (f64 lanes, the same operations): the buffers are views of its memory.
      const g = k.mixGains;
      g[0] = gl0;
      g[1] = dgl;
      g[2] = gr0;
      g[3] = dgr;
      const finite = k.mix(x0.byteOffset, x1.byteOffset, mixL.byteOffset + 4 * offset, mixR.byteOffset + 4 * offset, frames);
      if (finite === 0) this.filter.reset();
      return this.alive(envEnd);
    }
    let check = 0;
    for (let i = 0; i < frames; i++) {
      const a = x0[i];
      const b = x1[i];
      mixL[offset + i] += a * (gl0 + dgl * (i + 1));
      mixR[offset + i] += b * (gr0 + dgr * (i + 1));
      check += a + b;
    }
    if (!(check - check === 0)) this.filter.reset(); // non-finite input: do not let it live on in the filter state
    return this.alive(envEnd);
  }

  /** In the block the sound arrives: start the read so that the sound's first frame plays at the arrival sample. */
  private arrive(ratios: Float32Array): void {
    if (this.arrivalFrames > 0) {
      let early = 0;
      for (let i = 0; i < this.arrivalFrames; i++) early += ratios[i];
      this.reader.position = this.reader.position - early;
      this.arrivalFrames = 0;
    }
    if (this.arrivalSkipFrames > 0) {
      this.reader.position = this.reader.position + this.arrivalSkipFrames * ratios[0];
      this.arrivalSkipFrames = 0;
    }
  }

  private alive(envEnd: number): boolean {
    if (this.state === VOICE_RELEASING && envEnd === 0) return false;
    return !(this.stretch !== null ? this.stretch.finished : this.reader.finished);
  }

  private advanceCutoff(target: number, frames: number): void {
    const v = this.cutoffLog2.advance(target, frames);
    if (Math.abs(v - target) < 1e-4) this.cutoffLog2.reset(target);
  }

  /** Dilation tone: low-pass per sub-block, bypassed when fully open, crossfaded over one block on each change. */
  private tone(bufs: Float32Array[], dry: Float32Array[], frames: number, target: number): void {
    const wasWet = this.filterWet;
    const before = this.cutoffLog2.value;
    const nowWet = !(target >= OPEN_LOG2 && (before >= OPEN_LOG2 || target - before < 1e-3));
    this.filterWet = nowWet;
    if (!wasWet && !nowWet) {
      this.advanceCutoff(target, frames);
      return;
    }
    const chans = bufs.length;
    const changing = wasWet !== nowWet;
    if (changing) for (let ch = 0; ch < chans; ch++) copy(bufs[ch], dry[ch], frames);
    if (!wasWet) this.filter.reset();
    const sr = this.sampleRate;
    for (let off = 0; off < frames; off += TONE_SUB_BLOCK) {
      const n = frames - off < TONE_SUB_BLOCK ? frames - off : TONE_SUB_BLOCK;
      let c = this.cutoffLog2.advance(target, n);
      if (Math.abs(c - target) < 1e-4) {
        this.cutoffLog2.reset(target);
        c = target;
      }
      this.filter.setLowpass(Math.pow(2, c), TONE_Q, sr);
      this.filter.process(bufs, off, n);
    }
    if (!changing) return;
    for (let ch = 0; ch < chans; ch++) {
      const x = bufs[ch];
      const d = dry[ch];
      for (let i = 0; i < frames; i++) {
        const w = (i + 1) / frames;
        x[i] = nowWet ? d[i] + (x[i] - d[i]) * w : x[i] + (d[i] - x[i]) * w;
      }
    }
  }
}

function copy(from: Float32Array, to: Float32Array, frames: number): void {
  for (let i = 0; i < frames; i++) to[i] = from[i];
}

function clampRatio(r: number): number {
  return r >= MIN_RATIO ? (r <= MAX_RATIO ? r : MAX_RATIO) : MIN_RATIO;
}
