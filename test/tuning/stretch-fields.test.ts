// The 'stretch' policy's fields: optional in files (old files load unchanged), validated, and round-tripped.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { defaultTuning, groupOptionalDefaults, groupOptionalLimits, curveLimits, parseTuning, serializeTuning, TuningError } from '../../src/tuning';
import { validateSchema } from './json-schema-subset';

const schema = JSON.parse(readFileSync(resolve(__dirname, '../../src/tuning/tuning.schema.json'), 'utf8'));

function withMusic(patch: Record<string, unknown>): Record<string, unknown> {
  const doc = JSON.parse(JSON.stringify(defaultTuning));
  for (const g of Object.values(doc.groups) as Record<string, unknown>[]) {
    delete g.stretchPitch;
    delete g.stretchFreeze;
  }
  Object.assign(doc.groups.music, patch);
  return doc;
}

describe('stretch policy fields', () => {
  it('fills pitch kept (0 cents) and silence at time scale 0 when a file omits them', () => {
    const t = parseTuning(withMusic({}));
    expect(t.groups.music.stretchPitch).toEqual({ interpolation: 'linear', keys: [{ x: 0, y: 0 }] });
    expect(t.groups.music.stretchFreeze).toBe('silence');
  });

  it('loads a version 0 document with the defaults of the new fields', () => {
    const t = parseTuning({ version: 0, groups: { effects: { policy: 'follow-time', pitch: [[0, 0], [4, 4]], tone: [[0, 20000]], level: [[0, 0]], doppler: true, priority: 1 } } });
    expect(t.groups.effects.stretchFreeze).toBe(groupOptionalDefaults.stretchFreeze);
  });

  it('accepts the stretch policy with a pitch curve in cents and a hold freeze, and round-trips them', () => {
    const doc = withMusic({ policy: 'stretch', stretchPitch: { interpolation: 'linear', keys: [{ x: 0, y: -600 }, { x: 1, y: 0 }] }, stretchFreeze: 'hold' });
    const t = parseTuning(doc);
    expect(t.groups.music.policy).toBe('stretch');
    expect(t.groups.music.stretchPitch.keys[0].y).toBe(-600);
    const text = serializeTuning(t);
    expect(parseTuning(text)).toEqual(t);
    expect(validateSchema(JSON.parse(text), schema)).toEqual([]);
    expect(validateSchema(doc, schema)).toEqual([]);
  });

  it.each([
    ['a pitch shift beyond two octaves', { stretchPitch: { interpolation: 'linear', keys: [{ x: 0, y: 2500 }] } }, 'groups.music.stretchPitch.keys[0].y'],
    ['an unknown freeze mode', { stretchFreeze: 'loop' }, 'groups.music.stretchFreeze'],
  ])('rejects %s naming its path (the schema too)', (_name, patch, path) => {
    const doc = withMusic(patch);
    expect(() => parseTuning(doc)).toThrow(TuningError);
    try {
      parseTuning(doc);
    } catch (e) {
      expect((e as TuningError).issues.map((i) => i.path)).toContain(path);
    }
    expect(validateSchema(doc, schema).length).toBeGreaterThan(0);
  });

  it('keeps the schema in step with the optional limits', () => {
    const g = schema.$defs.group;
    expect(g.required).not.toContain('stretchPitch');
    expect(g.properties.stretchFreeze.enum).toEqual(groupOptionalLimits.stretchFreeze.values);
    const y = schema.$defs.stretchPitchCurve.properties.keys.items.properties.y;
    expect([y.minimum, y.maximum]).toEqual([curveLimits.y.stretchPitch.min, curveLimits.y.stretchPitch.max]);
  });
});
