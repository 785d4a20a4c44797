// The block path of StretchReader (read, skip, grain starts with their search) allocates nothing after construction.
import { describe, expect, it } from 'vitest';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { KernelTable } from '../../src/dsp';
import { StretchReader } from '../../src/stretch';
import { seededRandom } from '../../src/random';

describe('StretchReader block path', () => {
  it('keeps the heap flat over 4,000 stereo blocks of gliding speeds and pitches, loops and one-shots', () => {
    setFlagsFromString('--expose-gc');
    const gc = runInNewContext('gc') as () => void;
    const rand = seededRandom(5);
    const src = [0, 1].map(() => Float32Array.from({ length: 48000 }, () => rand() * 2 - 1));
    const r = new StretchReader({ table: KernelTable.forTier('standard'), channels: 2, sampleRate: 48000 });
    const out = [new Float32Array(128), new Float32Array(128)];
    const blocks = (n: number) => {
      for (let b = 0; b < n; b++) {
        if (b % 200 === 0) r.setSource(src, b % 400 === 0 ? { loop: true, loopStart: 1000, loopEnd: 20000 } : { startFrame: 100 });
        const s = (b % 23) * 0.05;
        const p = 0.7 + (b % 11) * 0.06;
        if (b % 7 === 6) r.skip(128, s, s * 1.1);
        else r.read(out, 0, 128, s, s * 1.1, p, p * 1.01);
      }
    };
    blocks(3000); // warm-up long enough for the optimising compiler to settle on a loaded machine
    gc();
    const before = process.memoryUsage().heapUsed;
    blocks(4000);
    const after = process.memoryUsage().heapUsed;
    gc();
    const settled = process.memoryUsage().heapUsed;
    // Same bounds as test/dsp/stream-reader-allocation.test.ts: nothing retained, no buffer or boxed number per sample.
    expect(settled - before).toBeLessThan(64 * 1024);
    expect((after - before) / 4000).toBeLessThan(2048);
  });
});
