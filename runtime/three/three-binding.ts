// Binds three.js objects to the runtime: each frame, world matrices give listener and source positions,
// orientations (−z forward, +y up, as three's AudioListener) and finite-difference velocities.
import type { Object3D } from 'three';
import type { Seconds, Tuning, Vec3Like } from '../../src/index';
import { VelocityEstimator } from '../../src/motion/index';
import type { RalentiListener } from '../ralenti';
import type { RalentiSource } from '../ralenti-source';

/** What the binding drives: a Ralenti fits. */
export interface SnapshotTarget {
  readonly tuning: Tuning;
  /** True once the target was disposed or its context closed (its calls then throw): update() skips it. */
  readonly closed?: boolean;
  createSource(): RalentiSource;
  setListener(listener: RalentiListener): void;
  update(time?: Seconds): void;
}

/** Options of ThreeBinding. */
export interface ThreeBindingOptions {
  /** The runtime to feed. */
  target: SnapshotTarget;
  /**
   * Estimate velocities here from world positions and send them (default false: positions only, and the engine
   * derives velocities from its trajectory history without lag; true sends smoothed finite differences, which lag).
   */
  estimateVelocity?: boolean;
  /** Call updateWorldMatrix on bound objects before reading them (default false: read after the renderer or scene.updateMatrixWorld()). */
  updateMatrices?: boolean;
}

/** Frozen defaults of ThreeBindingOptions. */
export const threeBindingDefaults = Object.freeze({ estimateVelocity: false, updateMatrices: false });

interface Bound {
  readonly object: Object3D;
  source: RalentiSource;
  estimator: VelocityEstimator;
  position: Vec3Like;
}

/** Listener and sources from three.js objects; call update() once per animation frame. */
export class ThreeBinding {
  private target: SnapshotTarget;
  private readonly estimate: boolean;
  private readonly updateMatrices: boolean;
  private readonly bound = new Map<Object3D, Bound>();
  private listenerObject: Object3D | null = null;
  private readonly listenerEstimator: VelocityEstimator;
  private readonly listener: Required<RalentiListener>;
  private tuning: Tuning;

  /** Creates a binding for `options.target`. */
  constructor(options: ThreeBindingOptions) {
    this.target = options.target;
    this.estimate = options.estimateVelocity ?? threeBindingDefaults.estimateVelocity;
    this.updateMatrices = options.updateMatrices ?? threeBindingDefaults.updateMatrices;
    this.tuning = this.target.tuning;
    this.listenerEstimator = new VelocityEstimator(this.estimatorOptions());
    this.listener = {
      position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 }, velocity: { x: 0, y: 0, z: 0 },
    };
  }

  /** Makes `object` (a camera or any Object3D) the listener. */
  bindListener(object: Object3D): void {
    this.listenerObject = object;
    this.listenerEstimator.reset();
  }

  /** Binds `object` as a source (idempotent) and returns its source, for `ralenti.play(sound, { source })`. */
  bindSource(object: Object3D): RalentiSource {
    const existing = this.bound.get(object);
    if (existing) return existing.source;
    const b: Bound = {
      object, source: this.target.createSource(), estimator: new VelocityEstimator(this.estimatorOptions()), position: { x: 0, y: 0, z: 0 },
    };
    this.bound.set(object, b);
    return b.source;
  }

  /** The source bound to `object`, if any. */
  sourceOf(object: Object3D): RalentiSource | undefined {
    return this.bound.get(object)?.source;
  }

  /** Declares that `object` jumped (respawn, portal): its next position restarts its track, with no Doppler sweep. */
  teleport(object: Object3D): void {
    this.bound.get(object)?.source.teleport();
  }

  /** Unbinds `object` and disposes its source (voices on it keep their last position). */
  unbindSource(object: Object3D): void {
    const b = this.bound.get(object);
    if (!b) return;
    b.source.dispose();
    this.bound.delete(object);
  }

  /** Moves every binding to a new target (e.g. a runtime rebuilt by HowlerBridge): new sources, same objects. */
  retarget(target: SnapshotTarget): void {
    this.target = target;
    for (const b of this.bound.values()) {
      b.source.dispose();
      b.source = target.createSource();
    }
    this.retune();
  }

  /** Number of bound sources. */
  get size(): number {
    return this.bound.size;
  }

  /**
   * Reads every bound object's world matrix at wall-clock `time` (seconds, e.g. the animation-frame timestamp / 1000),
   * updates positions and velocities, and sends one snapshot stamped with that same `time`: positions and their stamps
   * share one clock, so motion keeps its speed even when the audio clock drifts from the frame clock under load (the
   * engine maps snapshot time onto its own and uses only differences).
   */
  update(time: Seconds): void {
    // Between a dispose and retarget() (e.g. while the howler bridge rebuilds) there is nothing to drive.
    if (this.target.closed === true) return;
    if (this.target.tuning !== this.tuning) this.retune();
    const lo = this.listenerObject;
    if (lo) {
      if (this.updateMatrices) lo.updateWorldMatrix(true, false);
      const e = lo.matrixWorld.elements;
      const l = this.listener;
      set(l.position, e[12], e[13], e[14]);
      setUnit(l.forward, -e[8], -e[9], -e[10], 0, 0, -1);
      setUnit(l.up, e[4], e[5], e[6], 0, 1, 0);
      if (this.estimate) {
        const v = this.listenerEstimator.update(l.position, time);
        set(l.velocity, v.x, v.y, v.z);
        this.target.setListener(l);
      } else {
        this.target.setListener({ position: l.position, forward: l.forward, up: l.up });
      }
    }
    for (const b of this.bound.values()) {
      if (this.updateMatrices) b.object.updateWorldMatrix(true, false);
      const e = b.object.matrixWorld.elements;
      set(b.position, e[12], e[13], e[14]);
      b.source.setPosition(e[12], e[13], e[14]);
      if (this.estimate) {
        const v = b.estimator.update(b.position, time);
        b.source.setVelocity(v.x, v.y, v.z);
      }
    }
    this.target.update(time);
  }

  private estimatorOptions() {
    const d = this.tuning.doppler;
    return { smoothingSeconds: d.velocitySmoothingSeconds, teleportSpeed: d.teleportSpeed };
  }

  private retune(): void {
    this.tuning = this.target.tuning;
    const o = this.estimatorOptions();
    this.listenerEstimator.configure(o);
    for (const b of this.bound.values()) b.estimator.configure(o);
  }
}

function set(out: Vec3Like, x: number, y: number, z: number): void {
  out.x = x;
  out.y = y;
  out.z = z;
}

/** Normalises (x, y, z) into out; a zero or non-finite vector gives the fallback direction. */
function setUnit(out: Vec3Like, x: number, y: number, z: number, fx: number, fy: number, fz: number): void {
  const len = Math.sqrt(x * x + y * y + z * z);
  if (len > 0 && len < Infinity) set(out, x / len, y / len, z / len);
  else set(out, fx, fy, fz);
}
