// Routed group outputs: groups named at construction mix into their own stereo buffers instead of the master bus,
// leaving after their bus gain and before the master gain and limiter; the engine writes them to the host's extra
// outputs with non-finite samples zeroed and a hard clamp at the master ceiling (the game's own chain follows).
import type { VoiceScratch } from './voice';

/** Largest number of routed groups. */
export const MAX_GROUP_OUTPUTS = 8;

/** Buffers and a plain-mix scratch for the routed groups; creates no objects per block (docs/allocation.md). */
export class GroupRoutes {
  /** Routed group names, in output order. */
  readonly names: readonly string[];
  /** Per route: left and right mix buffers (maxBlockFrames). */
  readonly left: Float32Array[];
  readonly right: Float32Array[];
  /** Non-finite samples zeroed and samples clamped at the ceiling on the routed outputs. */
  clamps = 0;
  /** Clamp level of `finish`, linear (a field: V8 boxes a double passed to a call it does not inline). */
  ceiling = 0.5;
  /** Voice scratch whose buffers alias the engine's but mix in TypeScript, into these plain buffers. */
  private readonly scratch: VoiceScratch;

  /** Allocates buffers for each of `names` (at most MAX_GROUP_OUTPUTS; duplicates are one route); throws RangeError beyond. */
  constructor(names: readonly string[], maxBlockFrames: number) {
    const unique = [...new Set(names)];
    if (unique.length > MAX_GROUP_OUTPUTS) throw new RangeError(`EngineOptions.groupOutputs: at most ${MAX_GROUP_OUTPUTS} groups, got ${unique.length}`);
    this.names = unique;
    this.left = unique.map(() => new Float32Array(maxBlockFrames));
    this.right = unique.map(() => new Float32Array(maxBlockFrames));
    this.scratch = { stereo: [], mono: [], dry: [], wasm: null, ratios: new Float32Array(0), stage: null };
  }

  /** Route index of `group`, or −1 when it mixes into the master bus. */
  indexOf(group: string): number {
    return this.names.indexOf(group);
  }

  /** Zeroes the first `n` frames of every route. */
  clear(n: number): void {
    for (let r = 0; r < this.left.length; r++) {
      this.left[r].fill(0, 0, n);
      this.right[r].fill(0, 0, n);
    }
  }

  /** The engine's scratch with its module-memory mix switched off (the views are re-read each block: memory may grow). */
  scratchFor(main: VoiceScratch): VoiceScratch {
    const s = this.scratch;
    s.stereo[0] = main.stereo[0];
    s.stereo[1] = main.stereo[1];
    s.mono[0] = main.mono[0];
    s.dry[0] = main.dry[0];
    s.dry[1] = main.dry[1];
    s.ratios = main.ratios;
    s.stage = main.stage;
    return s;
  }

  /** Writes `n` frames of each route to outputs[r][0|1] from `offset` (missing outputs are skipped), clamped to ±`ceiling`. */
  finish(outputs: readonly (readonly Float32Array[])[] | undefined, offset: number, n: number): void {
    if (outputs === undefined) return;
    for (let r = 0; r < this.left.length && r < outputs.length; r++) {
      const out = outputs[r];
      if (out === undefined || out.length === 0) continue;
      this.write(this.left[r], out[0], offset, n);
      this.write(this.right[r], out.length > 1 ? out[1] : out[0], offset, n);
    }
  }

  private write(from: Float32Array, to: Float32Array, offset: number, n: number): void {
    const ceiling = this.ceiling;
    for (let i = 0; i < n; i++) {
      let x = from[i];
      if (!(x >= -ceiling && x <= ceiling)) {
        this.clamps++;
        x = x > ceiling ? ceiling : x < -ceiling ? -ceiling : 0;
      }
      to[offset + i] = x;
    }
  }
}
