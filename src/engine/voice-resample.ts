// The resample stage of a voice: band-limited variable-ratio reading (Kaiser-windowed sinc, polyphase table; see
// src/dsp/stream-reader.ts) at the pitch stage's ratio ramp, per-sample ratios for a propagating voice, or WSOLA
// time stretch for 'stretch' groups; and the matching position advance without output for a virtual voice.
import type { VoiceTargets } from '../dilation';
import type { SourceRead } from './voice-source-read';
import type { VoicePitch } from './voice-pitch';

/**
 * Reads one block of `frames` into `bufs` (1 or 2 channels) from `source` at `pitch`'s ratios: the stretch stage when
 * the voice has one, the per-sample `ratios` of a propagating voice (silent before its arrival sample), else the
 * linear ratio ramp of the block.
 */
export function resampleBlock(source: SourceRead, pitch: VoicePitch, bufs: readonly Float32Array[], frames: number, ratios: Float32Array, silentFrames: number, targets: VoiceTargets): void {
  // Doubles go over in the callees' fields: V8 boxes a double passed to a call it does not inline (docs/allocation.md).
  const stretch = source.stretch;
  if (stretch !== null) {
    stretch.speedStart = pitch.blockStart;
    stretch.speedEnd = pitch.current;
    stretch.dopplerCents = pitch.dopplerCents.value;
    stretch.readBlock(bufs, frames, targets);
  } else if (source.propagating) {
    source.reader.readRatios(bufs, 0, frames, ratios, 0);
    // Before the arrival sample nothing has reached the listener yet (only in the arrival block: `fill` is a builtin
    // call even for no frames, twice per voice and block otherwise).
    if (silentFrames > 0) for (let c = 0; c < bufs.length; c++) bufs[c].fill(0, 0, silentFrames);
  } else {
    const reader = source.reader;
    reader.rampStart = pitch.blockStart;
    reader.rampEnd = pitch.current;
    reader.readRamp(bufs, 0, frames);
  }
}

/** Advances `source` as `resampleBlock` would, without output (a virtual voice); `advance`: a propagating voice's frames read. */
export function skipBlock(source: SourceRead, pitch: VoicePitch, frames: number, advance: number, targets: VoiceTargets): void {
  const stretch = source.stretch;
  if (stretch !== null) {
    stretch.speedStart = pitch.blockStart;
    stretch.speedEnd = pitch.current;
    stretch.dopplerCents = pitch.dopplerCents.value;
    stretch.skipBlock(frames, targets);
  } else if (source.propagating) source.reader.position = source.reader.position + advance;
  else {
    const reader = source.reader;
    reader.rampStart = pitch.blockStart;
    reader.rampEnd = pitch.current;
    reader.skipRamp(frames);
  }
}
