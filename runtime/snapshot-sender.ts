// The update() path: the runtime's live sources and listener, encoded into one reused array per snapshot.
import type { EngineSnapshot, Seconds, Vec3Like } from '../src/index';
import { encodeSnapshot, type Command } from './protocol';
import { RalentiSource } from './ralenti-source';
import type { RalentiListener } from './ralenti-types';
import { RalentiOptionError } from './runtime-error';

/** Live sources and the listener of one runtime, sent as one snapshot per update(). */
export class SnapshotSender {
  /** Live sources of this runtime. */
  readonly sources = new Set<RalentiSource>();
  private readonly listener: Required<Omit<RalentiListener, 'velocity'>> & { velocity?: Vec3Like } = {
    position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 },
  };
  private readonly snapshot: EngineSnapshot = { time: 0, listener: this.listener, sources: [] };
  private encoded: Float64Array = new Float64Array(0);
  private nextSource = 1;

  /** `maxSources`: most sources per snapshot (the engine's source slots); `send` posts a command. */
  constructor(
    private readonly maxSources: number,
    private readonly send: (c: Command) => void,
  ) {}

  /** A new live source; `voiced` is the runtime's set of sources with voices, which it leaves when disposed. */
  createSource(voiced: Set<RalentiSource>): RalentiSource {
    const s = new RalentiSource(this.nextSource++, (source) => this.send({ type: 'teleport', source }));
    this.sources.add(s);
    s.onDispose = () => {
      this.sources.delete(s);
      voiced.delete(s);
    };
    return s;
  }

  /** `source`'s id when it is a live source of this runtime; else throws RalentiOptionError naming `field`. */
  liveId(field: string, source: RalentiSource): number {
    if (!source.alive || !this.sources.has(source)) throw new RalentiOptionError(field, 'not a live source of this runtime');
    return source.id;
  }

  /** Copies the listener into the next snapshot. */
  setListener(l: RalentiListener): void {
    copy(this.listener.position, l.position);
    copy(this.listener.forward, l.forward);
    copy(this.listener.up, l.up);
    if (l.velocity) this.listener.velocity = copy(this.listener.velocity ?? { x: 0, y: 0, z: 0 }, l.velocity);
    else delete this.listener.velocity;
  }

  /**
   * Sends changed spatial settings, then one snapshot stamped `time`: every live source, or beyond maxSources only
   * those in `voiced` (up to maxSources); returns how many live sources were left out.
   */
  sendSnapshot(time: Seconds, voiced: ReadonlySet<RalentiSource>): number {
    const list = this.snapshot.sources;
    list.length = 0;
    const pool = this.sources.size <= this.maxSources ? this.sources : voiced;
    for (const s of pool) {
      if (s.spatialChanged) this.send({ type: 'source-spatial', source: s.id, spatial: s.takeSpatial() });
      if (list.length < this.maxSources) list.push(s.snapshotState());
    }
    this.snapshot.time = time;
    // Posting clones the array (it is not transferred), so the same one is overwritten next time.
    this.encoded = encodeSnapshot(this.snapshot, this.encoded);
    this.send({ type: 'snapshot', data: this.encoded });
    return this.sources.size - list.length;
  }
}

function copy(out: Vec3Like, v: Vec3Like): Vec3Like {
  out.x = v.x;
  out.y = v.y;
  out.z = v.z;
  return out;
}
