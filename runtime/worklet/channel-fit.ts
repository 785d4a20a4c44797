// The engine renders stereo; a node whose output has another channel count gets the stereo pair through a scratch
// pair: averaged into one channel, or copied into the first two with the rest silent. Allocates nothing.
import type { Engine } from '../../src/engine/index';

/** Frames per render quantum the scratch pair holds. */
const QUANTUM = 128;

/** A stereo scratch pair, and the copy from it into an output of any channel count. */
export class ChannelFit {
  private readonly left = new Float32Array(QUANTUM);
  private readonly right = new Float32Array(QUANTUM);
  private readonly pair: Float32Array[] = [this.left, this.right];

  /** Renders `frames` (≤ 128; throws beyond) of `engine` into `output` of 1 or 3+ channels. */
  render(engine: Engine, output: Float32Array[], frames: number): void {
    if (frames > QUANTUM) throw new Error(`block of ${frames} frames exceeds ${QUANTUM}`);
    engine.render(this.pair, frames);
    const l = this.left;
    const r = this.right;
    if (output.length === 1) for (let i = 0; i < frames; i++) output[0][i] = 0.5 * (l[i] + r[i]);
    else {
      for (let i = 0; i < frames; i++) {
        output[0][i] = l[i];
        output[1][i] = r[i];
      }
      for (let c = 2; c < output.length; c++) output[c].fill(0);
    }
  }
}

/** Fills every channel of `output` with zeros. */
export function silence(output: Float32Array[]): void {
  for (const ch of output) ch.fill(0);
}
