// Tuning text: keys repeated within one object are problems at their JSON path (JSON.parse would keep the last
// silently; RFC 8259 §4, docs/references.md §19.2), and text over MAX_TUNING_TEXT is refused before it is parsed.
import { describe, expect, it } from 'vitest';
import { defaultTuning, findDuplicateKeys, MAX_TUNING_TEXT, parseTuning, serializeTuning, TuningError } from '../../src/tuning';

const text = serializeTuning(defaultTuning);

function issuesOf(t: string) {
  try {
    parseTuning(t);
  } catch (e) {
    expect(e).toBeInstanceOf(TuningError);
    return (e as TuningError).issues;
  }
  throw new Error('expected a TuningError');
}

describe('duplicate keys in tuning text', () => {
  it.each([
    ['{"a": 1, "a": 2}', ['a']],
    ['{"a": {"b": 1, "c": 2, "b": 3}}', ['a.b']],
    ['{"a": [{"x": 1}, {"x": 1, "x": 2}]}', ['a[1].x']],
    ['{"a": [[1, 2], {"k": 1, "k": 1}]}', ['a[1].k']],
    ['{"we\\"ird": 1, "we\\u0022ird": 2}', ['["we\\"ird"]']],
    ['{"s": "{\\"a\\": 1, \\"a\\": 2}", "t": [",", "}", "]"]}', []],
    ['{"a": 1, "b": {"a": 2}, "c": [{"a": 3}]}', []],
  ])('finds the repeats of %s', (json, paths) => {
    expect(findDuplicateKeys(json).map((d) => d.path)).toEqual(paths);
  });

  it('reports a repeated field of a real tuning file at its JSON path, as a problem', () => {
    const doubled = text.replace('"ceilingDb": -1', '"ceilingDb": -1, "ceilingDb": -24');
    const issues = issuesOf(doubled);
    expect(issues).toEqual([{ path: 'master.ceilingDb', message: 'duplicate key "ceilingDb" (JSON would keep only the last one)' }]);
  });

  it('reports a repeated group name', () => {
    const doubled = text.replace('"groups": {', '"groups": { "music": {}, ');
    expect(issuesOf(doubled)[0].path).toBe('groups.music');
  });

  it('still loads the file without repeats', () => {
    expect(parseTuning(text)).toEqual(defaultTuning);
  });
});

describe('tuning text size', () => {
  it(`refuses text over ${MAX_TUNING_TEXT} characters before parsing it (even when it is not JSON)`, () => {
    const big = ' '.repeat(MAX_TUNING_TEXT) + '{';
    const issues = issuesOf(big);
    expect(issues).toHaveLength(1);
    expect(issues[0].path).toBe('');
    expect(issues[0].message).toMatch(/at most 4194304 \(4 MiB\)/);
  });

  it('loads the largest valid tuning (64 groups of 64-key curves) pretty-printed at an 8-space indent', () => {
    const doc = JSON.parse(text);
    const g = doc.groups.effects;
    const keys = (y: number) => Array.from({ length: 64 }, (_, i) => ({ x: (4 * i) / 63, y }));
    doc.groups = {};
    for (let i = 0; i < 64; i++) doc.groups[i === 0 ? 'effects' : `group-${i}`] = { ...g, pitch: { ...g.pitch, keys: keys(0) }, tone: { ...g.tone, keys: keys(1000) }, level: { ...g.level, keys: keys(0) } };
    const wide = JSON.stringify(doc, null, 8);
    expect(wide.length).toBeGreaterThan(2_000_000);
    expect(wide.length).toBeLessThan(MAX_TUNING_TEXT);
    expect(Object.keys(parseTuning(wide).groups)).toHaveLength(64);
  });
});
