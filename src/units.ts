// Unit aliases used across the core, so that every number says what it measures.

/** Frequency in hertz. */
export type Hz = number;
/** Time in seconds. */
export type Seconds = number;
/** Pitch interval in cents (1200 per octave). */
export type Cents = number;
/** Level in decibels (20·log10 of an amplitude ratio). */
export type Decibels = number;
/** Speed in metres per second. */
export type MetersPerSecond = number;
/** Distance in metres. */
export type Meters = number;
/** Temperature in degrees Celsius. */
export type Celsius = number;

/** A 3-vector; a three.js Vector3 fits. */
export interface Vec3Like {
  x: number;
  y: number;
  z: number;
}
