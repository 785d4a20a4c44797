// The engine clock of the block being rendered, handed to a voice's stages as one object: V8 boxes a double passed to a
// call it does not inline, while fields declared with doubles are read and written in place (docs/allocation.md).

/** Engine time at the start of the block being rendered and the sample rate; rewritten in place each block. */
export class BlockClock {
  /** Engine time at the block's start, s (≥ 0). */
  now = 0.5;
  /** Sample rate, Hz (8000…192000). */
  sampleRate = 0.5;

  /** A clock at time 0 for `sampleRate` (Hz). */
  constructor(sampleRate: number) {
    this.now = 0;
    this.sampleRate = sampleRate;
  }
}
