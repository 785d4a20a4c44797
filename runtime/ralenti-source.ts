// A positioned sound source on the main thread: its latest position and optional explicit velocity.
import type { SourceSpatial, SourceState, Vec3Like } from '../src/index';
import { sourceSpatialProblems } from '../src/dilation/index';
import { RalentiOptionError } from './runtime-error';

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
  /** Voices following this source that have not ended (kept by the runtime). */
  voiceCount = 0;
  /** Called once by dispose() (set by the runtime). */
  onDispose: (() => void) | null = null;
  /** True when spatial settings or orientation changed since the last update(). */
  spatialChanged = false;
  private spatial: SourceSpatial | null = null;
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

  /**
   * Sets this source's own distance model and sound cone (Web Audio PannerNode names and units: angles in degrees,
   * coneOuterGain linear 0…1), overriding the tuning's distance settings; null goes back to the tuning's.
   * Throws RalentiOptionError naming a bad field; sent with the next update().
   */
  setSpatial(spatial: SourceSpatial | null): this {
    if (spatial !== null) {
      const [problem] = sourceSpatialProblems(spatial);
      if (problem) throw new RalentiOptionError(`setSpatial.${problem[0]}`, problem[1]);
      const o = spatial.orientation ?? this.spatial?.orientation;
      this.spatial = { ...spatial, ...(o ? { orientation: { x: o.x, y: o.y, z: o.z } } : {}) };
    } else this.spatial = null;
    this.spatialChanged = true;
    return this;
  }

  /** Sets the direction the source faces (for its cone; any length, zero = no cone); sent with the next update() when changed. */
  setOrientation(x: number, y: number, z: number): this {
    if (![x, y, z].every(Number.isFinite)) throw new RalentiOptionError('setOrientation', 'expected finite numbers');
    const o = this.spatial?.orientation;
    if (o && o.x === x && o.y === y && o.z === z) return this;
    this.spatial = { ...(this.spatial ?? {}), orientation: { x, y, z } };
    this.spatialChanged = true;
    return this;
  }

  /** The spatial settings to send (a copy), clearing the changed flag. */
  takeSpatial(): SourceSpatial | null {
    this.spatialChanged = false;
    return this.spatial === null ? null : { ...this.spatial };
  }

  /** Removes the source from later snapshots. */
  dispose(): void {
    if (!this.alive) return;
    this.alive = false;
    this.onDispose?.();
  }

  /** The source's snapshot entry (own object, refreshed in place). */
  snapshotState(): SourceState {
    if (this.velocity) this.state.velocity = this.velocity;
    else delete this.state.velocity;
    return this.state;
  }
}
