// A positioned sound source on the main thread: its latest position and optional explicit velocity.
import type { SourceState, Vec3Like } from '../src/index';

/** A source that voices can follow; its state goes out with every `Ralenti.update()`. */
export class RalentiSource {
  /** Id of the source in snapshots (unique within its runtime). */
  readonly id: number;
  /** Position in metres (world space). */
  readonly position: Vec3Like = { x: 0, y: 0, z: 0 };
  /** Explicit velocity in m/s (wall clock), or null to let the engine estimate it from positions. */
  velocity: Vec3Like | null = null;
  /** False after dispose(): the source leaves the snapshots. */
  alive = true;
  private readonly state: SourceState;
  private readonly onTeleport: ((id: number) => void) | null;

  /** Created by Ralenti.createSource(); not meant to be built directly. */
  constructor(id: number, onTeleport: ((id: number) => void) | null = null) {
    this.id = id;
    this.state = { id, position: this.position };
    this.onTeleport = onTeleport;
  }

  /** Declares a jump (respawn, portal): the next position starts the source's track afresh, with no Doppler sweep. */
  teleport(): this {
    this.onTeleport?.(this.id);
    return this;
  }

  /** Sets the position in metres. */
  setPosition(x: number, y: number, z: number): this {
    this.position.x = x;
    this.position.y = y;
    this.position.z = z;
    return this;
  }

  /** Sets an explicit velocity in m/s (wall clock). */
  setVelocity(x: number, y: number, z: number): this {
    if (!this.velocity) this.velocity = { x, y, z };
    else {
      this.velocity.x = x;
      this.velocity.y = y;
      this.velocity.z = z;
    }
    return this;
  }

  /** Drops the explicit velocity; the engine estimates it from positions again. */
  clearVelocity(): this {
    this.velocity = null;
    return this;
  }

  /** Removes the source from later snapshots. */
  dispose(): void {
    this.alive = false;
  }

  /** The source's snapshot entry (own object, refreshed in place). */
  snapshotState(): SourceState {
    if (this.velocity) this.state.velocity = this.velocity;
    else delete this.state.velocity;
    return this.state;
  }
}
