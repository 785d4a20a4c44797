// Public entry of the pure core ("ralenti"): exports grow as the layers land.
export type { Hz, Seconds, Cents, Decibels, MetersPerSecond, Meters, Celsius, Vec3Like } from './units';
export type * from './tuning/tuning-types';
export type * from './dilation/snapshot-types';
export type * from './engine/engine-types';
