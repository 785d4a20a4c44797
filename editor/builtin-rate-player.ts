// A/B reference path: plays the same looped sources through AudioBufferSourceNode.playbackRate (the browser's own
// resampler), following the engine's monitored ratio, cutoff and gain for each voice.
import { distanceGain } from '../src/dilation';
import { centsToRatio, dbToGain, type Tuning, type VoiceMonitor } from '../src';

/** One source the comparison path mirrors. */
export interface ComparisonSource {
  /** Display name. */
  name: string;
  /** The same audio the engine plays. */
  buffer: AudioBuffer;
  /** Id of the engine voice to follow (RalentiVoice.id = VoiceMonitor.voice). */
  voiceId: number;
  /** Whether the voice is positional (distance gain applies). */
  positional: boolean;
  /** Stereo position −1 (left) … 1 (right), read every frame. */
  pan(): number;
}

interface Chain {
  source: ComparisonSource;
  node: AudioBufferSourceNode;
  filter: BiquadFilterNode;
  gain: GainNode;
  panner: StereoPannerNode;
}

/** Control-rate smoothing of the built-in path's parameters (setTargetAtTime time constant), seconds. */
const FOLLOW_SECONDS = 0.02;

/** Plays the comparison copies into `output` while running; update() once per frame. */
export class BuiltinRatePlayer {
  private readonly context: BaseAudioContext;
  private readonly output: AudioNode;
  private readonly sources: readonly ComparisonSource[];
  private readonly tap: AudioNode | null;
  private chains: Chain[] = [];

  /** Sets up the player (`tap` also receives the copies, for metering); nothing plays until start(). */
  constructor(options: { context: BaseAudioContext; output: AudioNode; sources: readonly ComparisonSource[]; tap?: AudioNode }) {
    this.context = options.context;
    this.tap = options.tap ?? null;
    this.output = options.output;
    this.sources = options.sources;
  }

  /** True while the copies play. */
  get running(): boolean {
    return this.chains.length > 0;
  }

  /** Starts one looping AudioBufferSourceNode per source. */
  start(): void {
    if (this.running) return;
    const now = this.context.currentTime;
    this.chains = this.sources.map((source) => {
      const node = this.context.createBufferSource();
      node.buffer = source.buffer;
      node.loop = true;
      const filter = this.context.createBiquadFilter();
      filter.type = 'lowpass';
      filter.frequency.value = Math.min(20000, this.context.sampleRate / 2 - 1);
      filter.Q.value = Math.SQRT1_2;
      const gain = this.context.createGain();
      gain.gain.value = 0;
      const panner = this.context.createStereoPanner();
      node.connect(filter).connect(gain).connect(panner).connect(this.output);
      if (this.tap) panner.connect(this.tap);
      node.start(now);
      return { source, node, filter, gain, panner };
    });
  }

  /** Stops and disconnects the copies. */
  stop(): void {
    for (const c of this.chains) {
      try {
        c.node.stop();
      } catch {
        // Already stopped.
      }
      c.panner.disconnect();
    }
    this.chains = [];
  }

  /** Follows the engine's latest per-voice monitors. */
  update(voices: readonly VoiceMonitor[], tuning: Tuning): void {
    if (!this.running) return;
    const t = this.context.currentTime;
    const nyquist = this.context.sampleRate / 2;
    for (const c of this.chains) {
      const m = voices.find((v) => v.voice === c.source.voiceId);
      if (!m) {
        c.gain.gain.setTargetAtTime(0, t, FOLLOW_SECONDS);
        continue;
      }
      const ratio = centsToRatio(m.ratioCents);
      c.node.playbackRate.setTargetAtTime(Math.max(1 / 1024, Math.min(16, ratio)), t, FOLLOW_SECONDS);
      c.filter.frequency.setTargetAtTime(Math.min(m.cutoffHz, nyquist - 1), t, FOLLOW_SECONDS);
      const d = tuning.distance;
      const spatial = c.source.positional ? distanceGain(d.model, m.distance, d.refDistance, d.maxDistance, d.rolloffFactor) : 1;
      c.gain.gain.setTargetAtTime(m.virtual ? 0 : dbToGain(m.gainDb) * spatial, t, FOLLOW_SECONDS);
      c.panner.pan.setTargetAtTime(Math.max(-1, Math.min(1, c.source.pan())), t, FOLLOW_SECONDS);
    }
  }
}
