// fast-check generator of valid tuning documents, built from the parser's own limit table (test helper).
import fc from 'fast-check';
import { curveLimits, groupLimits, sectionLimits, type FieldLimit } from '../../src/tuning';

function scalar(limit: FieldLimit): fc.Arbitrary<unknown> {
  if (limit.kind === 'boolean') return fc.boolean();
  if (limit.kind === 'enum') return fc.constantFrom(...limit.values);
  const n = limit.integer
    ? fc.integer({ min: limit.min, max: limit.max })
    : fc.oneof(fc.double({ min: limit.min, max: limit.max, noNaN: true, noDefaultInfinity: true }), fc.constantFrom(limit.min, limit.max));
  return limit.nullable ? fc.option(n, { nil: null }) : n;
}

function curve(kind: 'pitch' | 'tone' | 'level'): fc.Arbitrary<unknown> {
  const xs = fc.uniqueArray(scalar(curveLimits.x) as fc.Arbitrary<number>, {
    minLength: 1,
    maxLength: 8,
    comparator: (a, b) => a === b || (a === 0 && b === 0),
  });
  return fc.record({
    interpolation: fc.constantFrom(...curveLimits.interpolation.values),
    keys: xs.chain((x) => {
      const sorted: number[] = [];
      for (const v of [...x].map((w) => (w === 0 ? 0 : w)).sort((a, b) => a - b)) {
        if (sorted.length === 0 || v - sorted[sorted.length - 1] >= curveLimits.minSpacing) sorted.push(v);
      }
      return fc.tuple(...sorted.map(() => scalar(curveLimits.y[kind]))).map((ys) => sorted.map((xv, i) => ({ x: xv, y: ys[i] })));
    }),
  });
}

const group = fc.record(
  Object.fromEntries(
    Object.entries(groupLimits).map(([k, limit]) => [k, limit === 'curve' ? curve(k as 'pitch' | 'tone' | 'level') : scalar(limit)]),
  ),
);

/** Arbitrary valid version-1 tuning documents (every section present). */
export const tuningDocument: fc.Arbitrary<Record<string, unknown>> = fc
  .tuple(
    fc.record(
      Object.fromEntries(
        Object.entries(sectionLimits).map(([name, fields]) => [
          name,
          fc.record(Object.fromEntries(Object.entries(fields).map(([k, limit]) => [k, scalar(limit as FieldLimit)]))),
        ]),
      ),
    ),
    group,
    fc.dictionary(fc.stringMatching(/^[A-Za-z][A-Za-z0-9_-]{0,10}$/), group, { maxKeys: 4 }),
  )
  .map(([sections, effects, others]) => {
    const groups: Record<string, unknown> = { effects };
    for (const [name, g] of Object.entries(others)) if (!(name in Object.prototype) && name !== 'prototype' && name !== 'effects') groups[name] = g;
    return { version: 1, ...sections, groups };
  });
