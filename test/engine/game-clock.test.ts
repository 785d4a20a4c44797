import { describe, expect, it } from 'vitest';
import { GameClock } from '../../src/engine/game-clock';

// Reference: the clock's definition (game-clock.ts), G(T) = ∫ s dT with one slope per advanced block, written out
// here as a sum over the blocks. Times in halves of a second and slopes in quarters keep every sum exact in binary
// floating point, so the look-ups must equal it to the bit.
function closedForm(blocks: readonly { end: number; scale: number }[], T: number): { game: number; slope: number } {
  let time = 0;
  let game = 0;
  let slope = 1;
  for (const b of blocks) {
    if (T < time) break;
    if (T < b.end) return { game: game + b.scale * (T - time), slope: b.scale };
    game += b.scale * (b.end - time);
    time = b.end;
    slope = b.scale;
  }
  return { game: game + slope * (T - time), slope };
}

/** A seeded linear congruential generator (Numerical Recipes' constants), 0 ≤ x < 1. */
function lcg(seed: number): () => number {
  let x = seed >>> 0;
  return () => {
    x = (Math.imul(x, 1664525) + 1013904223) >>> 0;
    return x / 2 ** 32;
  };
}

describe('GameClock look-ups', () => {
  it('gives the closed-form game time and slope for queries in any order (the search starts from the last one found)', () => {
    const rand = lcg(7);
    const blocks: { end: number; scale: number }[] = [];
    const clock = new GameClock(4096);
    for (let k = 1; k <= 300; k++) {
      // Runs of equal slopes (no new entry) between changes.
      const scale = rand() < 0.6 && blocks.length > 0 ? blocks[blocks.length - 1].scale : Math.floor(rand() * 9) / 4;
      blocks.push({ end: k / 2, scale });
      clock.advance(k / 2, scale);
    }
    const queries: number[] = [];
    for (let i = 0; i < 2000; i++) queries.push(Math.floor(rand() * 2 * 300 + 1) / 4);
    // In order, then jumping about, then from far on each side.
    for (const T of [...[...queries].sort((a, b) => a - b), ...queries, 0.25, 149.75, 0.5, 150]) {
      clock.query = T;
      clock.lookUp();
      const want = closedForm(blocks, T);
      expect(clock.gameFound).toBe(want.game);
      expect(clock.slopeFound).toBe(want.slope);
    }
  });

  it('finds the same entries after its history wrapped (8 entries kept)', () => {
    const clock = new GameClock(8);
    const blocks: { end: number; scale: number }[] = [];
    for (let k = 1; k <= 40; k++) {
      const scale = (k % 5) / 4 + 0.25;
      blocks.push({ end: k / 2, scale });
      clock.advance(k / 2, scale);
    }
    // The kept entries cover the last eight slopes (engine times 16.5…20); look-ups inside them, both ways.
    const inside = [19.75, 16.75, 18.25, 17.25, 19.25, 16.75, 20, 18.75];
    for (const T of inside) {
      clock.query = T;
      clock.lookUp();
      const want = closedForm(blocks, T);
      expect(clock.gameFound).toBe(want.game);
      expect(clock.slopeFound).toBe(want.slope);
    }
  });

  it('gives the first entry for a NaN query, wherever the last search ended', () => {
    const clock = new GameClock(64);
    for (let k = 1; k <= 20; k++) clock.advance(k / 2, (k % 3) / 4 + 0.5);
    clock.query = 9.25;
    clock.lookUp();
    clock.query = NaN;
    clock.lookUp();
    expect(clock.slopeFound).toBe(1);
    expect(clock.gameFound).toBeNaN();
  });
});
