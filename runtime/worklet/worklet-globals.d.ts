// Globals of the AudioWorkletGlobalScope (Web Audio API §1.32), which TypeScript's DOM library does not declare.
// Only runtime/worklet/ code may use them: they do not exist on the main thread.

/** Base class of audio worklet processors (Web Audio API §1.32.3). */
declare class AudioWorkletProcessor {
  /** The processor side of the node's MessageChannel. */
  readonly port: MessagePort;
  constructor(options?: AudioWorkletNodeOptions);
}

/** Registers a processor class under a name for `new AudioWorkletNode(ctx, name)`. */
declare function registerProcessor(
  name: string,
  processorCtor: new (options: AudioWorkletNodeOptions) => AudioWorkletProcessor,
): void;

/** Sample rate of the owning BaseAudioContext, in Hz. */
declare const sampleRate: number;

/** Context time of the render quantum being processed, in seconds. */
declare const currentTime: number;

/** Sample frame of the render quantum being processed. */
declare const currentFrame: number;
