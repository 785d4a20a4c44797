// Speed of sound in dry air from temperature, ideal-gas law c = c0·sqrt(T_K / 273.15 K)
// (OpenStax University Physics Vol. 1 §17.3 gives the same law as 331 m/s · sqrt(1 + T/273)).
import type { Celsius, MetersPerSecond } from '../units';

/** Speed of sound at 0 °C used by the ideal-gas form, m/s (331.3; OpenStax rounds it to 331). */
export const SPEED_OF_SOUND_0C: MetersPerSecond = 331.3;
/** 0 °C in kelvin. */
export const ZERO_CELSIUS_KELVIN = 273.15;

/**
 * Speed of sound in air at `celsius` °C, m/s: 331.3·sqrt(1 + T/273.15).
 * Valid for ordinary air temperatures (−50…60 °C is the tuning range); at or below absolute zero
 * returns 0; a non-finite temperature is treated as 20 °C (343.2 m/s).
 */
export function speedOfSound(celsius: Celsius): MetersPerSecond {
  const t = Number.isFinite(celsius) ? celsius : 20;
  const k = 1 + t / ZERO_CELSIUS_KELVIN;
  return k > 0 ? SPEED_OF_SOUND_0C * Math.sqrt(k) : 0;
}
