import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseTuning, serializeTuning } from '../../src/tuning';
import { TargetMapper, createVoiceTargets } from '../../src/dilation';
import { tuningDocument } from './tuning-arbitrary';

describe('serializeTuning round trip over random valid tunings', () => {
  it('parse(serialize(t)) deep-equals t and serialising again gives the same text (seeded)', () => {
    fc.assert(
      fc.property(tuningDocument, (doc) => {
        const t = parseTuning(doc);
        const text = serializeTuning(t);
        const back = parseTuning(text);
        expect(back).toEqual(t);
        expect(serializeTuning(back)).toBe(text);
      }),
      { seed: 4242, numRuns: 300 },
    );
  });

  it('every valid tuning builds a target mapper whose outputs stay finite (seeded)', () => {
    fc.assert(
      fc.property(tuningDocument, fc.double({ min: 0, max: 4, noNaN: true }), (doc, s) => {
        const m = new TargetMapper({ tuning: parseTuning(doc) });
        const out = createVoiceTargets();
        const v = { x: 0, y: 0, z: 0 };
        m.map(out, {
          timeScale: s,
          group: 'effects',
          baseRatio: 1,
          gain: 1,
          listener: { position: v, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 }, velocity: v },
          source: { id: 1, position: { x: 3, y: 0, z: -4 }, velocity: { x: 0, y: 0, z: 20 } },
        });
        expect(Object.values(out).every((x) => typeof x === 'boolean' || Number.isFinite(x))).toBe(true);
        expect(out.ratio).toBeGreaterThan(0);
        expect(out.ratio).toBeLessThanOrEqual(4);
      }),
      { seed: 4243, numRuns: 200 },
    );
  });
});
