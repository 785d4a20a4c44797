// The engine-or-browser comparison: the same sources through the browser's own playbackRate path, with the engine
// bus muted while it plays, and a meter tap on that path so the readouts follow what is heard.
import type { Ralenti } from '../runtime';
import { BuiltinRatePlayer, type ComparisonSource } from './builtin-rate-player';

/** Which path plays: the Ralenti engine, or the browser's built-in playbackRate. */
export type PlaybackPathMode = 'engine' | 'builtin';

/** The comparison path of a page that gives comparison sources, a master gain and an engine bus. */
export class PlaybackPath {
  /** The mode the panel binds to. */
  readonly state: { mode: PlaybackPathMode } = { mode: 'engine' };
  private readonly player: BuiltinRatePlayer;
  private readonly tap: AnalyserNode | null;
  private readonly buffer = new Float32Array(2048);
  private readonly ralenti: Ralenti;
  private readonly engineBus: GainNode;

  constructor(ralenti: Ralenti, master: GainNode, engineBus: GainNode, sources: readonly ComparisonSource[]) {
    this.ralenti = ralenti;
    this.engineBus = engineBus;
    const ctx = ralenti.context;
    this.tap = typeof ctx.createAnalyser === 'function' ? ctx.createAnalyser() : null;
    if (this.tap) this.tap.fftSize = this.buffer.length;
    this.player = new BuiltinRatePlayer({ context: ctx, output: master, sources, tap: this.tap ?? undefined });
  }

  /** Starts or stops the browser path after `state.mode` changed (the engine bus fades over about 50 ms). */
  switched(): void {
    const builtin = this.state.mode === 'builtin';
    if (builtin) this.player.start();
    this.engineBus.gain.setTargetAtTime(builtin ? 0 : 1, this.ralenti.context.currentTime, 0.02);
    if (!builtin) setTimeout(() => this.player.stop(), 150);
  }

  /** Follows the engine's voices; returns the browser path's peak (linear) while it plays, else undefined. */
  update(): number | undefined {
    this.player.update(this.ralenti.voices, this.ralenti.tuning);
    if (this.state.mode !== 'builtin' || !this.tap) return undefined;
    this.tap.getFloatTimeDomainData(this.buffer);
    let p = 0;
    for (const x of this.buffer) p = Math.max(p, Math.abs(x));
    return p;
  }

  /** Stops the copies. */
  stop(): void {
    this.player.stop();
  }
}
