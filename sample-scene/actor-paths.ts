// Where each moving sound source is at a given game time: pure functions of time, so slowing time slows them.
import type { Vec3Like } from '../src/units';

/** Fly-by drone: a straight pass along x at 45 m/s, 14 m in front of the start point, 6 m up; wraps every 8 s. */
export const DRONE_SPEED = 45;
/** Half length of the drone's pass in metres. */
export const DRONE_HALF_PASS = 180;

/** Writes the drone's position at game time `t` (seconds) into `out`. */
export function dronePosition(t: number, out: Vec3Like): Vec3Like {
  const span = 2 * DRONE_HALF_PASS;
  const d = (((t * DRONE_SPEED) % span) + span) % span;
  out.x = d - DRONE_HALF_PASS;
  out.y = 6;
  out.z = -14;
  return out;
}

/** Kart loop track: centre and radius in metres; one lap takes about 9.4 s at 20 m/s. */
export const TRACK_CENTER: Readonly<Vec3Like> = Object.freeze({ x: -10, y: 0, z: -48 });
/** Radius of the kart's loop track in metres. */
export const TRACK_RADIUS = 30;
/** Kart speed along the track in m/s. */
export const KART_SPEED = 20;

/** Writes the kart's position at game time `t` into `out`; returns its heading angle in radians via `out`. */
export function kartPosition(t: number, out: Vec3Like): Vec3Like {
  const a = (t * KART_SPEED) / TRACK_RADIUS;
  out.x = TRACK_CENTER.x + TRACK_RADIUS * Math.cos(a);
  out.y = 0.5;
  out.z = TRACK_CENTER.z + TRACK_RADIUS * Math.sin(a);
  return out;
}

/** Kart heading (radians about +y) at game time `t`, tangent to the track. */
export function kartHeading(t: number): number {
  const a = (t * KART_SPEED) / TRACK_RADIUS;
  return -a;
}

/** Orb orbit around the listener: radius in metres and angular speed in rad/s (about 12.6 m/s). */
export const ORB_RADIUS = 3.5;
/** Orb angular speed in radians per second of game time. */
export const ORB_ANGULAR_SPEED = 3.6;

/** Offset of the orbit's centre from the listener in metres (so the distance swings and Doppler is heard). */
export const ORB_CENTER_OFFSET = 2.2;

/** Writes the orb's position at game time `t`, circling near `center` (the listener), into `out`. */
export function orbPosition(t: number, center: Vec3Like, out: Vec3Like): Vec3Like {
  const a = t * ORB_ANGULAR_SPEED;
  out.x = center.x + ORB_RADIUS * Math.cos(a);
  out.y = center.y - 1.4 + 0.3 * Math.sin(2 * a);
  out.z = center.z - ORB_CENTER_OFFSET + ORB_RADIUS * Math.sin(a);
  return out;
}

/** Fixed places of the stationary objects. */
export const GENERATOR_POSITION: Readonly<Vec3Like> = Object.freeze({ x: 22, y: 0, z: -22 });
/** The music mast (the music loop is non-positional; the mast only marks it). */
export const MUSIC_MAST_POSITION: Readonly<Vec3Like> = Object.freeze({ x: -9, y: 0, z: 15 });
/** The interface console (its clicks are non-positional; the console only marks them). */
export const CONSOLE_POSITION: Readonly<Vec3Like> = Object.freeze({ x: -4, y: 0, z: 6 });
