// Messages between the audio-capture processor (audio thread) and AudioCapture (main thread).

/** Name the capture processor registers under (in the same worklet module as the engine's processor). */
export const CAPTURE_PROCESSOR_NAME = 'ralenti-capture';

/** Frames per capture chunk (32 render quanta). */
export const CAPTURE_CHUNK_FRAMES = 4096;

/** Main → audio thread: an empty chunk to fill (its buffers are transferred), or stop. */
export type CaptureCommand = { type: 'chunk'; left: Float32Array; right: Float32Array } | { type: 'stop' };

/** Audio → main thread: a filled chunk (buffers transferred back), with the context time of its first frame. */
export type CaptureReport =
  | { type: 'chunk'; left: Float32Array; right: Float32Array; frames: number; startTime: number }
  | { type: 'dropped'; frames: number; startTime: number };
