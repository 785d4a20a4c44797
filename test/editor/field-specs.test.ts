// The panel's fields against the format: every scalar of the format has a field whose range is the format's own.
import { describe, expect, it } from 'vitest';
import { curveFieldSpecs, groupPrioritySpec, roundToStep, sectionFieldSpecs, tooltipOf } from '../../editor/field-specs';
import { roundCurveKeys } from '../../editor/sections/group-section';
import { curveLimits, groupLimits, sectionLimits } from '../../src/tuning/index';
import tuningSchema from '../../src/tuning/tuning.schema.json';

describe('editor field specs', () => {
  it('has one field for every scalar of every section of the format, with the format’s range', () => {
    const formatPaths = Object.entries(sectionLimits).flatMap(([s, fields]) => Object.keys(fields).map((k) => `${s}.${k}`));
    expect(sectionFieldSpecs.map((f) => f.path)).toEqual(formatPaths);
    for (const f of sectionFieldSpecs) {
      const [s, k] = f.path.split('.');
      expect(f.limit, f.path).toEqual((sectionLimits as Record<string, Record<string, unknown>>)[s][k]);
    }
    expect(groupPrioritySpec.limit).toEqual(groupLimits.priority);
    expect(curveFieldSpecs.pitch.limit).toEqual(curveLimits.y.pitch);
    expect(curveFieldSpecs.tone.limit).toEqual(curveLimits.y.tone);
    expect(curveFieldSpecs.level.limit).toEqual(curveLimits.y.level);
  });

  it('matches the published JSON Schema’s minimum and maximum for every numeric section field', () => {
    const props = (tuningSchema as unknown as { properties: Record<string, { properties: Record<string, { minimum?: number; maximum?: number }> }> }).properties;
    let checked = 0;
    for (const f of sectionFieldSpecs) {
      if (f.limit.kind !== 'number') continue;
      const [s, k] = f.path.split('.');
      const p = props[s].properties[k];
      expect([f.limit.min, f.limit.max], f.path).toEqual([p.minimum, p.maximum]);
      checked++;
    }
    expect(checked).toBeGreaterThanOrEqual(15);
  });

  it.each([
    [0.1, 0.01, 0.1],
    [0.30000000000000004, 0.01, 0.3],
    [0.09999999999999996, 0.01, 0.1],
    [-90.04, 0.1, -90],
    [1234.5, 1, 1235],
    [0.0256, 0.001, 0.026],
  ])('rounds %s to step %s as %s (the shortest decimal)', (v, step, want) => {
    expect(roundToStep(v, step)).toBe(want);
  });

  it('says unit and range in every tooltip', () => {
    for (const f of sectionFieldSpecs) {
      const t = tooltipOf(f);
      if (f.limit.kind === 'number') {
        expect(t, f.path).toContain(`${f.limit.min}…${f.limit.max}`);
        if (f.unit) expect(t, f.path).toContain(f.unit);
      } else if (f.limit.kind === 'enum') for (const v of f.limit.values) expect(t).toContain(v);
      else expect(t).toContain('On or off');
    }
  });
});

describe('roundCurveKeys', () => {
  it('rounds y to the step inside the range, and x to 0.001 only where the keys stay strictly increasing', () => {
    const spec = { interpolation: 'linear' as const, keys: [{ x: 0, y: 0.12345 }, { x: 0.50004, y: 1.00049 }, { x: 0.70041, y: 5 }] };
    expect(roundCurveKeys(spec, 0.001, { min: 0, max: 4 }).keys).toEqual([{ x: 0, y: 0.123 }, { x: 0.5, y: 1 }, { x: 0.7, y: 4 }]);
    // Two keys that would both round to x = 0.5 keep their exact x.
    const close = { interpolation: 'linear' as const, keys: [{ x: 0.50004, y: 1 }, { x: 0.50041, y: 1 }] };
    expect(roundCurveKeys(close, 0.001, { min: 0, max: 4 }).keys.map((k) => k.x)).toEqual([0.50004, 0.50041]);
    const same = { interpolation: 'linear' as const, keys: [{ x: 0, y: 1 }] };
    expect(roundCurveKeys(same, 0.001, { min: 0, max: 4 })).toBe(same);
  });
});
