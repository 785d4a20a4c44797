// Main-thread side of the recording capture: taps the engine's output node on the audio thread (capture-processor.ts,
// registered by the engine's worklet module), keeps at most maxSeconds of stereo audio in chunks, and gives it back
// aligned to a page-clock start time, ready to write as a WAV file beside the scene script.
import { CAPTURE_CHUNK_FRAMES, CAPTURE_PROCESSOR_NAME, type CaptureReport } from './capture-protocol';

/** Options of AudioCapture. */
export interface AudioCaptureOptions {
  /** Most seconds kept, 1…3600 (default 600, as the recorder): later audio is dropped and counted. */
  maxSeconds?: number;
  /** Chunks lent to the audio thread at once, 2…64 (default 8, about 0.7 s at 48 kHz). */
  chunksInFlight?: number;
}

/** Frozen defaults of AudioCaptureOptions. */
export const audioCaptureDefaults = Object.freeze({ maxSeconds: 600, chunksInFlight: 8 });

/** Captured audio: stereo at the context's rate, sample 0 at the page time given to stop(). */
export interface CapturedAudio {
  sampleRate: number;
  channels: [Float32Array, Float32Array];
  /** Frames the audio thread could not store (no free chunk) or that passed the length limit. */
  droppedFrames: number;
}

/** One capture of an engine output node at a time. */
export class AudioCapture {
  private node: AudioWorkletNode | null = null;
  private chunks: { left: Float32Array; right: Float32Array; frames: number; startTime: number }[] = [];
  private kept = 0;
  private dropped = 0;
  private readonly maxFrames: number;
  private readonly inFlight: number;
  private stopped: Promise<void> | null = null;
  private resolveStopped: (() => void) | null = null;
  private pageAtContextZero = 0;

  /** Validates the options (RangeError naming the field). */
  constructor(
    private readonly context: BaseAudioContext,
    private readonly source: AudioNode,
    options: AudioCaptureOptions = {},
  ) {
    const max = options.maxSeconds ?? audioCaptureDefaults.maxSeconds;
    const n = options.chunksInFlight ?? audioCaptureDefaults.chunksInFlight;
    if (!(max >= 1 && max <= 3600)) throw new RangeError(`AudioCapture: maxSeconds must be in 1…3600, got ${max}`);
    if (!(Number.isInteger(n) && n >= 2 && n <= 64)) throw new RangeError(`AudioCapture: chunksInFlight must be an integer in 2…64, got ${n}`);
    this.maxFrames = Math.ceil(max * context.sampleRate);
    this.inFlight = n;
  }

  /** Whether a capture runs. */
  get capturing(): boolean {
    return this.node !== null && this.stopped === null;
  }

  /**
   * Starts capturing. `pageNow` is the page clock (s) now; with the context's current time it maps context time to page
   * time for stop() (to within a render quantum).
   */
  start(pageNow: number): void {
    if (this.node) throw new Error('AudioCapture: already started');
    this.pageAtContextZero = pageNow - this.context.currentTime;
    const node = new AudioWorkletNode(this.context, CAPTURE_PROCESSOR_NAME, { numberOfInputs: 1, numberOfOutputs: 1, outputChannelCount: [1], channelCount: 2, channelCountMode: 'explicit' });
    node.port.onmessage = (event: MessageEvent<CaptureReport>) => this.receive(event.data);
    this.node = node;
    for (let i = 0; i < this.inFlight; i++) this.lend(new Float32Array(CAPTURE_CHUNK_FRAMES), new Float32Array(CAPTURE_CHUNK_FRAMES));
    this.source.connect(node);
    // The node outputs silence; connecting it keeps the audio thread pulling it.
    node.connect(this.context.destination);
  }

  private lend(left: Float32Array, right: Float32Array): void {
    this.node?.port.postMessage({ type: 'chunk', left, right }, [left.buffer, right.buffer]);
  }

  private receive(m: CaptureReport): void {
    if (m.type === 'dropped') {
      this.dropped += m.frames;
      return;
    }
    if (this.kept + m.frames <= this.maxFrames) {
      this.chunks.push({ left: m.left.slice(0, m.frames), right: m.right.slice(0, m.frames), frames: m.frames, startTime: m.startTime });
      this.kept += m.frames;
    } else this.dropped += m.frames;
    if (this.stopped === null) this.lend(m.left, m.right);
    else if (m.frames < CAPTURE_CHUNK_FRAMES) this.resolveStopped?.();
  }

  /**
   * Stops and returns the audio from page time `fromPage` (s, the fly-through recording's start) on: frames before it
   * are cut, a gap at its start is filled with silence. Resolves once the audio thread has handed back its last chunk.
   */
  async stop(fromPage: number): Promise<CapturedAudio> {
    const node = this.node;
    if (!node) throw new Error('AudioCapture: not started');
    this.stopped ??= new Promise<void>((resolve) => {
      this.resolveStopped = resolve;
      node.port.postMessage({ type: 'stop' });
      // A last chunk that happened to be exactly full never comes as a short one: do not wait for ever.
      setTimeout(resolve, 250);
    });
    await this.stopped;
    this.source.disconnect(node);
    node.disconnect();
    const sr = this.context.sampleRate;
    const startContext = fromPage - this.pageAtContextZero;
    const first = this.chunks.length > 0 ? this.chunks[0].startTime : startContext;
    const end = this.chunks.reduce((e, c) => Math.max(e, c.startTime + c.frames / sr), first);
    const total = Math.max(0, Math.round((end - startContext) * sr));
    const left = new Float32Array(total);
    const right = new Float32Array(total);
    for (const c of this.chunks) {
      const at = Math.round((c.startTime - startContext) * sr);
      for (let i = 0; i < c.frames; i++) {
        const k = at + i;
        if (k >= 0 && k < total) {
          left[k] = c.left[i];
          right[k] = c.right[i];
        }
      }
    }
    return { sampleRate: sr, channels: [left, right], droppedFrames: this.dropped };
  }
}
