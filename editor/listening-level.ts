// The listening volume of the master bus: a level in dB with a floor that means silence.
import { dbToGain, type Decibels } from '../src';

/** Lowest listening volume in dB; at or below it the master bus is silent. */
export const LISTENING_FLOOR_DB: Decibels = -60;

/** Master-bus gain for a listening volume in dB (≤ LISTENING_FLOOR_DB → 0, else 10^(dB/20)). */
export function listeningGain(db: Decibels): number {
  return db <= LISTENING_FLOOR_DB ? 0 : dbToGain(db);
}
