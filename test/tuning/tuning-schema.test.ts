import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import fc from 'fast-check';
import { curveLimits, defaultTuning, groupLimits, groupsLimits, isOptionalField, parseTuning, sectionLimits, topLevelKeys, type FieldLimit } from '../../src/tuning';

/** Keys the parser requires: every field but those added later with a value for when they are absent. */
function requiredKeys(fields: Record<string, FieldLimit | 'curve'>): string[] {
  return Object.entries(fields).filter(([, l]) => l === 'curve' || !isOptionalField(l)).map(([k]) => k);
}
import { validateSchema } from './json-schema-subset';
import { tuningDocument } from './tuning-arbitrary';

const schema = JSON.parse(readFileSync(resolve(__dirname, '../../src/tuning/tuning.schema.json'), 'utf8'));

function expectFieldMatches(node: Record<string, any>, limit: FieldLimit, where: string) {
  if (limit.kind === 'boolean') return expect(node.type, where).toBe('boolean');
  if (limit.kind === 'enum') return expect(node.enum, where).toEqual(limit.values);
  const type = limit.integer ? 'integer' : 'number';
  expect(node.type, where).toEqual(limit.nullable ? [type, 'null'] : type);
  expect([node.minimum, node.maximum], where).toEqual([limit.min, limit.max]);
}

describe('tuning.schema.json', () => {
  it('declares JSON Schema draft 2020-12', () => {
    expect(schema.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
  });

  it('lists the same top-level keys as the parser (plus the editors’ $schema key)', () => {
    expect(Object.keys(schema.properties)).toEqual(['$schema', ...topLevelKeys]);
  });

  it('matches the parser’s required fields, types, ranges and enums in every section', () => {
    for (const [name, fields] of Object.entries(sectionLimits)) {
      const node = schema.properties[name];
      expect(node.required, name).toEqual(requiredKeys(fields));
      expect(node.additionalProperties, name).toBe(false);
      for (const [k, limit] of Object.entries(fields)) expectFieldMatches(node.properties[k], limit as FieldLimit, `${name}.${k}`);
    }
  });

  it('matches the parser’s group and curve limits', () => {
    const g = schema.$defs.group;
    expect(g.required).toEqual(requiredKeys(groupLimits));
    for (const [k, limit] of Object.entries(groupLimits)) {
      if (limit === 'curve') {
        const c = schema.$defs[g.properties[k].$ref.split('/').pop()];
        expect(c.properties.interpolation.enum).toEqual(curveLimits.interpolation.values);
        const keys = c.properties.keys;
        expect([keys.minItems, keys.maxItems]).toEqual([curveLimits.minKeys, curveLimits.maxKeys]);
        expectFieldMatches(keys.items.properties.x, curveLimits.x, `${k}.x`);
        expectFieldMatches(keys.items.properties.y, curveLimits.y[k as 'pitch' | 'tone' | 'level'], `${k}.y`);
      } else expectFieldMatches(g.properties[k], limit, `group.${k}`);
    }
    const groups = schema.properties.groups;
    expect(groups.propertyNames.pattern).toBe(groupsLimits.namePattern.source);
    expect(groups.required).toEqual([groupsLimits.requiredGroup]);
    expect([groups.minProperties, groups.maxProperties]).toEqual([groupsLimits.minGroups, groupsLimits.maxGroups]);
  });

  it('validates the built-in tuning', () => {
    expect(validateSchema(JSON.parse(JSON.stringify(defaultTuning)), schema)).toEqual([]);
  });

  it('validates every random document the parser accepts (seeded)', () => {
    fc.assert(
      fc.property(tuningDocument, (doc) => {
        parseTuning(doc);
        expect(validateSchema(doc, schema)).toEqual([]);
      }),
      { seed: 777, numRuns: 200 },
    );
  });

  it.each([
    ['an unknown key', (d: any) => (d.doppler.extra = 1)],
    ['an out-of-range value', (d: any) => (d.master.ceilingDb = 3)],
    ['a wrong type', (d: any) => (d.air.temperatureCelsius = '20')],
    ['a wrong enum', (d: any) => (d.distance.model = 'inverse-square')],
    ['a missing field', (d: any) => delete d.smoothing.gainSeconds],
    ['a missing effects group', (d: any) => delete d.groups.effects],
    ['a bad group name', (d: any) => (d.groups['1x'] = d.groups.music)],
    ['a fractional priority', (d: any) => (d.groups.music.priority = 2.5)],
    ['a curve without keys', (d: any) => (d.groups.music.tone.keys = [])],
  ])('and the parser both reject %s', (_name, patch) => {
    const d = JSON.parse(JSON.stringify(defaultTuning));
    patch(d);
    expect(validateSchema(d, schema).length).toBeGreaterThan(0);
    expect(() => parseTuning(d)).toThrow();
  });
});
