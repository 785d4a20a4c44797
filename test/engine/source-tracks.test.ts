import { describe, expect, it } from 'vitest';
import { SourceTracks, TRACK_INSIDE } from '../../src/engine/source-tracks';

// Reference: a circle of radius R at angular speed w, p(t) = (R cos wt, 0, R sin wt), v(t) = (−Rw sin wt, 0, Rw cos wt),
// in closed form. A cubic Hermite segment between knots 1/60 s apart with exact velocities stays within
// R·(w·h)⁴/384 ≈ 1.6e-7 m of it here (the Hermite error bound, docs/references.md §13d), while the segment next to the
// right one misses by centimetres: a look-up that lands on a wrong segment fails the 1e-4 m bound.
const R = 10;
const W = 3;
const H = 1 / 60;

describe('SourceTracks.evaluate', () => {
  it('follows the closed-form path for queries alternating between the newest knots and older ones, after the ring wrapped', () => {
    const tracks = new SourceTracks(2, 64);
    const p = { x: 0, y: 0, z: 0 };
    const v = { x: 0, y: 0, z: 0 };
    const outP = { x: 0, y: 0, z: 0 };
    const outV = { x: 0, y: 0, z: 0 };
    let checked = 0;
    for (let k = 0; k < 200; k++) {
      const t = k * H;
      p.x = R * Math.cos(W * t);
      p.z = R * Math.sin(W * t);
      v.x = -R * W * Math.sin(W * t);
      v.z = R * W * Math.cos(W * t);
      tracks.at = t;
      tracks.append(1, p, v);
      if (k < 70) continue;
      // As a solve asks: near the newest knot, then 0.1…0.8 s back (the emission time), then near the newest again.
      for (const back of [0.3 * H, 0.1 + (k % 7) * 0.1, 0.1 + (k % 7) * 0.1 + 0.002, 0.7 * H, 0.9 - (k % 5) * 0.15, 0.5 * H]) {
        const T = t - back;
        tracks.at = T;
        expect(tracks.evaluate(1, outP, outV)).toBe(TRACK_INSIDE);
        expect(Math.abs(outP.x - R * Math.cos(W * T))).toBeLessThan(1e-4);
        expect(Math.abs(outP.z - R * Math.sin(W * T))).toBeLessThan(1e-4);
        expect(Math.abs(outV.x + R * W * Math.sin(W * T))).toBeLessThan(1e-2);
        checked++;
      }
    }
    expect(checked).toBe(6 * 130);
  });
});
