// Fly camera: WASD / arrow keys to move, Q / E down and up, Shift to go faster, mouse look under pointer lock.
import * as THREE from 'three';

/** Options of the fly camera; speeds in m/s of wall-clock time. */
export interface FlyCameraOptions {
  camera: THREE.PerspectiveCamera;
  /** Element that takes pointer lock on click. */
  element: HTMLElement;
  /** Walking speed in m/s (default 8). */
  speed?: number;
  /** Multiplier while Shift is held (default 4). */
  fastFactor?: number;
  /** Mouse look sensitivity in radians per pixel (default 0.0022). */
  lookSensitivity?: number;
}

const defaults = Object.freeze({ speed: 8, fastFactor: 4, lookSensitivity: 0.0022 });

const moveKeys: Readonly<Record<string, readonly [number, number, number]>> = Object.freeze({
  KeyW: [0, 0, -1],
  ArrowUp: [0, 0, -1],
  KeyS: [0, 0, 1],
  ArrowDown: [0, 0, 1],
  KeyA: [-1, 0, 0],
  ArrowLeft: [-1, 0, 0],
  KeyD: [1, 0, 0],
  ArrowRight: [1, 0, 0],
  KeyQ: [0, -1, 0],
  KeyE: [0, 1, 0],
});

/** A first-person fly camera; call update(wallSeconds) once per frame. */
export class FlyCamera {
  /** Whether the mouse currently steers the view. */
  get locked(): boolean {
    return document.pointerLockElement === this.element;
  }

  private readonly camera: THREE.PerspectiveCamera;
  private readonly element: HTMLElement;
  private readonly speed: number;
  private readonly fastFactor: number;
  private readonly lookSensitivity: number;
  private readonly held = new Set<string>();
  private readonly euler = new THREE.Euler(0, 0, 0, 'YXZ');
  private readonly move = new THREE.Vector3();
  private enabled = true;

  /** Binds keyboard and mouse listeners to the window and `element`. */
  constructor(options: FlyCameraOptions) {
    this.camera = options.camera;
    this.element = options.element;
    this.speed = options.speed ?? defaults.speed;
    this.fastFactor = options.fastFactor ?? defaults.fastFactor;
    this.lookSensitivity = options.lookSensitivity ?? defaults.lookSensitivity;
    this.euler.setFromQuaternion(this.camera.quaternion);
    window.addEventListener('keydown', (e) => {
      if (this.enabled && !isTyping(e)) this.held.add(e.code);
    });
    window.addEventListener('keyup', (e) => this.held.delete(e.code));
    window.addEventListener('blur', () => this.held.clear());
    this.element.addEventListener('click', () => {
      if (this.enabled && !this.locked) this.element.requestPointerLock?.()?.catch?.(() => {});
    });
    document.addEventListener('mousemove', (e) => {
      if (!this.locked) return;
      this.euler.y -= e.movementX * this.lookSensitivity;
      this.euler.x -= e.movementY * this.lookSensitivity;
      this.euler.x = Math.max(-1.5, Math.min(1.5, this.euler.x));
      this.camera.quaternion.setFromEuler(this.euler);
    });
  }

  /** Turns keyboard movement on or off (off while the start overlay shows). */
  setEnabled(enabled: boolean): void {
    this.enabled = enabled;
    if (!enabled) this.held.clear();
  }

  /** Points the camera at a world position. */
  lookAt(x: number, y: number, z: number): void {
    this.camera.lookAt(x, y, z);
    this.euler.setFromQuaternion(this.camera.quaternion);
  }

  /** Moves the camera by the held keys over `dt` seconds of wall-clock time. */
  update(dt: number): void {
    this.move.set(0, 0, 0);
    for (const code of this.held) {
      const d = moveKeys[code];
      if (d) this.move.x += d[0], this.move.y += d[1], this.move.z += d[2];
    }
    if (this.move.lengthSq() === 0) return;
    const fast = this.held.has('ShiftLeft') || this.held.has('ShiftRight');
    const vertical = this.move.y;
    this.move.y = 0;
    this.move.normalize().applyQuaternion(this.camera.quaternion);
    this.move.y += vertical;
    this.camera.position.addScaledVector(this.move, dt * this.speed * (fast ? this.fastFactor : 1));
    this.camera.position.y = Math.max(0.3, this.camera.position.y);
  }
}

/** True when a key press belongs to a text field (the editor's numeric fields). */
export function isTyping(e: KeyboardEvent): boolean {
  const t = e.target as HTMLElement | null;
  return !!t && (t.tagName === 'INPUT' || t.tagName === 'SELECT' || t.tagName === 'TEXTAREA' || t.isContentEditable);
}
