// The engine-bench scene for the Chromium timing: stereo voices, mixed loops and one-shots, base ratios spread
// 0.8…1.2, half in a toned follow-time group ('effects') whose ratios glide with a time-scale ramp, half exempt.
import type { PlayOptions } from '../src/index';

/** Output rate of the benchmark, Hz. */
export const BENCH_RATE = 48000;

/** Four stereo two-partial tones (110, 220, 330, 440 Hz) of 1.5…3 s. */
export function benchSounds(): { channels: Float32Array[]; sampleRate: number }[] {
  return [0, 1, 2, 3].map((k) => {
    const hz = 110 * (k + 1);
    const n = Math.round((1.5 + k * 0.5) * BENCH_RATE);
    const channels = [0, 1].map((c) => {
      const x = new Float32Array(n);
      for (let i = 0; i < n; i++) x[i] = 0.02 * Math.sin((2 * Math.PI * hz * (1 + c * 0.01) * i) / BENCH_RATE) + 0.005 * Math.sin((2 * Math.PI * 3.1 * hz * i) / BENCH_RATE);
      return x;
    });
    return { channels, sampleRate: BENCH_RATE };
  });
}

/** Play requests for `voices` voices: sound index and options. */
export function benchPlays(voices: number): { sound: number; options: PlayOptions }[] {
  return Array.from({ length: voices }, (_, i) => ({
    sound: i % 4,
    options: { loop: i % 2 === 0, group: i % 4 < 2 ? 'effects' : 'interface', ratio: 0.8 + (i % 9) * 0.05, gain: 0.5, fadeInSeconds: 0.002 },
  }));
}

/** The time-scale ramp that makes the toned half glide: 1 → 0.6 over the whole render. */
export const BENCH_RAMP = Object.freeze({ target: 0.6, easing: 'linear' as const });

/** Voices of the moving scene (propagation on: the default tuning), two per source. */
export const MOVING_VOICES = 512;
/** Frames between two snapshots of the moving scene: 16 render quanta (about 23 snapshots per second at 48 kHz). */
export const MOVING_STEP_FRAMES = 2048;

/** Play requests of the moving scene: stereo loops on `voices` / 2 sources, base ratios 0.8…1.2, half 'effects', half 'vehicles'. */
export function movingPlays(voices: number): { sound: number; source: number; options: PlayOptions }[] {
  return Array.from({ length: voices }, (_, i) => ({
    sound: i % 4,
    source: i % (voices / 2),
    options: { loop: true, group: i % 2 ? 'effects' : 'vehicles', ratio: 0.8 + (i % 9) * 0.05, gain: 0.2, fadeInSeconds: 0 },
  }));
}

/** Position (m) of moving source `k` at time `t` (s): a circle of radius 10 + k m around the listener at the origin, 30 m/s. */
export function movingPosition(k: number, t: number): { x: number; y: number; z: number } {
  const radius = 10 + k;
  const a = (30 / radius) * t + k;
  return { x: radius * Math.cos(a), y: 0, z: radius * Math.sin(a) };
}
