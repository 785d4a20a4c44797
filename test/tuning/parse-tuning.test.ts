import { describe, expect, it } from 'vitest';
import { defaultTuning, parseTuning, serializeTuning, TuningError, TUNING_VERSION, type Tuning } from '../../src/tuning';

const clone = (): Record<string, any> => JSON.parse(JSON.stringify(defaultTuning));
const withDoc = (patch: (d: Record<string, any>) => void) => {
  const d = clone();
  patch(d);
  return d;
};

function issuesOf(input: unknown): { path: string; message: string }[] {
  try {
    parseTuning(input);
  } catch (e) {
    expect(e).toBeInstanceOf(TuningError);
    return [...(e as TuningError).issues];
  }
  throw new Error('expected parseTuning to throw');
}

function isDeepFrozen(v: unknown): boolean {
  if (v === null || typeof v !== 'object') return true;
  return Object.isFrozen(v) && Object.values(v).every(isDeepFrozen);
}

describe('parseTuning: valid documents', () => {
  it('accepts the built-in tuning and returns a deeply frozen copy equal to it', () => {
    const t = parseTuning(clone());
    expect(t).toEqual(defaultTuning);
    expect(isDeepFrozen(t)).toBe(true);
    expect(isDeepFrozen(defaultTuning)).toBe(true);
  });

  it('accepts JSON text', () => {
    expect(parseTuning(JSON.stringify(defaultTuning))).toEqual(defaultTuning);
  });

  it('fills omitted sections from the built-in tuning', () => {
    expect(parseTuning({ version: 1 })).toEqual(defaultTuning);
    const t = parseTuning({ version: 1, master: { limiter: true, ceilingDb: -3, gainDb: -6 } });
    expect(t.master.ceilingDb).toBe(-3);
    expect(t.doppler).toEqual(defaultTuning.doppler);
  });

  it('replaces the group set entirely when groups are given', () => {
    const t = parseTuning({ version: 1, groups: { effects: defaultTuning.groups.effects } });
    expect(Object.keys(t.groups)).toEqual(['effects']);
  });

  it('normalises −0 to 0 so that serialisation round-trips', () => {
    const t = parseTuning(withDoc((d) => (d.master.ceilingDb = -0)));
    expect(Object.is(t.master.ceilingDb, 0)).toBe(true);
  });

  it('accepts and drops a top-level $schema string for editors', () => {
    expect(parseTuning({ $schema: './tuning.schema.json', version: 1 })).toEqual(defaultTuning);
    expect(issuesOf({ $schema: 5, version: 1 })[0].path).toBe('$schema');
  });

  it('accepts a null speed of sound and an explicit one', () => {
    expect(parseTuning(withDoc((d) => (d.air.speedOfSound = 343.3))).air.speedOfSound).toBe(343.3);
  });
});

describe('parseTuning: rejected documents name the JSON path', () => {
  const cases: [string, unknown, string, RegExp][] = [
    ['unsorted curve keys', withDoc((d) => { d.groups.weapons = clone().groups.effects; d.groups.weapons.pitch.keys = [{ x: 0, y: 0 }, { x: 2, y: 1 }, { x: 1, y: 2 }]; }), 'groups.weapons.pitch.keys[2].x', /sorted by increasing x/],
    ['duplicate curve keys', withDoc((d) => (d.groups.effects.tone.keys = [{ x: 0.5, y: 1000 }, { x: 0.5, y: 2000 }])), 'groups.effects.tone.keys[1].x', /duplicate x/],
    ['curve keys closer than 1e-6', withDoc((d) => (d.groups.effects.tone.keys = [{ x: 0.5, y: 1000 }, { x: 0.5 + 1e-9, y: 2000 }])), 'groups.effects.tone.keys[1].x', /closer than 0.000001/],
    ['a number given as a string', withDoc((d) => (d.doppler.factor = '1')), 'doppler.factor', /expected a number, got the string "1"/],
    ['"NaN" as a string', withDoc((d) => (d.distance.refDistance = 'NaN')), 'distance.refDistance', /expected a number/],
    ['NaN in a caller object', withDoc((d) => (d.doppler.maxShiftCents = Number.NaN)), 'doppler.maxShiftCents', /finite/],
    ['Infinity in a caller object', withDoc((d) => (d.groups.effects.level.keys[0].y = -Infinity)), 'groups.effects.level.keys[0].y', /finite/],
    ['an out-of-range value', withDoc((d) => (d.doppler.maxShiftCents = 5000)), 'doppler.maxShiftCents', /out of range: 5000 is not within 0…2400/],
    ['a pitch key below 0', withDoc((d) => (d.groups.effects.pitch.keys[0].y = -1)), 'groups.effects.pitch.keys[0].y', /out of range/],
    ['a curve x beyond the largest time scale', withDoc((d) => (d.groups.effects.pitch.keys[1].x = 5)), 'groups.effects.pitch.keys[1].x', /out of range/],
    ['an unknown key in a section', withDoc((d) => (d.doppler.extra = 1)), 'doppler.extra', /unknown key/],
    ['an unknown top-level key', withDoc((d) => (d.reverb = {})), 'reverb', /unknown key/],
    ['an unknown key in a curve key', withDoc((d) => (d.groups.music.tone.keys[0].z = 1)), 'groups.music.tone.keys[0].z', /unknown key/],
    ['a missing field', withDoc((d) => delete d.doppler.teleportSpeed), 'doppler.teleportSpeed', /missing field/],
    ['a missing group field', withDoc((d) => delete d.groups.ambience.priority), 'groups.ambience.priority', /missing field/],
    ['a missing version', withDoc((d) => delete d.version), 'version', /missing field/],
    ['a wrong enum value', withDoc((d) => (d.doppler.velocityClock = 'gametime')), 'doppler.velocityClock', /expected one of "wall", "game"/],
    ['a fractional priority', withDoc((d) => (d.groups.effects.priority = 1.5)), 'groups.effects.priority', /whole number/],
    ['a boolean given as a number', withDoc((d) => (d.master.limiter = 1)), 'master.limiter', /true or false/],
    ['a section given as an array', withDoc((d) => (d.smoothing = [])), 'smoothing', /expected an object, got an array/],
    ['a curve with no keys', withDoc((d) => (d.groups.effects.level.keys = [])), 'groups.effects.level.keys', /1…64 keys/],
    ['a bad group name', withDoc((d) => (d.groups['9lives'] = d.groups.effects)), 'groups["9lives"]', /group names start with a letter/],
    ['a reserved group name', withDoc((d) => (d.groups.toString = d.groups.effects)), 'groups.toString', /reserved/],
    ['no effects group', withDoc((d) => delete d.groups.effects), 'groups', /missing group "effects"/],
    ['a newer schema version', withDoc((d) => (d.version = TUNING_VERSION + 1)), 'version', /newer than this runtime supports/],
    ['a fractional version', withDoc((d) => (d.version = 0.5)), 'version', /whole schema version/],
    ['a huge number in JSON text', JSON.stringify(clone()).replace('"teleportSpeed":400', '"teleportSpeed":1e400'), 'doppler.teleportSpeed', /finite/],
    ['malformed JSON text', '{"version": 1,', '', /not valid JSON/],
    ['an array document', [], '', /expected a tuning object/],
    ['a null document', null, '', /expected a tuning object/],
  ];
  it.each(cases)('rejects %s', (_name, doc, path, message) => {
    const issues = issuesOf(doc);
    const hit = issues.find((i) => i.path === path);
    expect(hit, JSON.stringify(issues)).toBeDefined();
    expect(hit!.message).toMatch(message);
  });

  it('lists every problem, not only the first', () => {
    const issues = issuesOf(withDoc((d) => {
      d.doppler.factor = -1;
      d.master.gainDb = 'loud';
      d.groups.effects.pitch.interpolation = 'cubic';
    }));
    expect(issues.map((i) => i.path)).toEqual(['doppler.factor', 'master.gainDb', 'groups.effects.pitch.interpolation']);
  });

  it('puts the paths and reasons in the error message', () => {
    expect(() => parseTuning(withDoc((d) => (d.doppler.factor = 99)))).toThrow(/doppler\.factor: out of range/);
  });
});

describe('parseTuning: prototype pollution guard', () => {
  it.each([
    ['__proto__ at the top', '{"version":1,"__proto__":{"polluted":true}}', '__proto__'],
    ['__proto__ inside a group', '{"version":1,"groups":{"effects":{"__proto__":{"polluted":true}}}}', 'groups.effects.__proto__'],
    ['constructor in a section', '{"version":1,"air":{"constructor":{"prototype":{"polluted":true}}}}', 'air.constructor'],
    ['prototype inside an unknown key', '{"version":1,"extra":{"prototype":{"polluted":true}}}', 'extra.prototype'],
    ['constructor as a group name', '{"version":1,"groups":{"constructor":{}}}', 'groups.constructor'],
  ])('rejects %s and leaves Object.prototype untouched', (_name, text, path) => {
    const issues = issuesOf(text);
    expect(issues.find((i) => i.path === path)?.message).toMatch(/forbidden key/);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    expect(Object.prototype.hasOwnProperty.call(Object.prototype, 'polluted')).toBe(false);
  });

  it('rejects an object whose prototype is not Object.prototype', () => {
    const sneaky = Object.create({ polluted: true });
    sneaky.version = 1;
    expect(issuesOf(sneaky)[0].message).toMatch(/expected a tuning object/);
    const nested = { version: 1, air: Object.assign(Object.create({ x: 1 }), clone().air) };
    expect(issuesOf(nested)[0]).toEqual({ path: 'air', message: 'expected a plain JSON object' });
  });

  it('reports a throwing getter instead of crashing', () => {
    const doc = clone();
    Object.defineProperty(doc, 'master', { enumerable: true, get: () => { throw new Error('boom'); } });
    expect(issuesOf(doc)[0].message).toMatch(/could not read the document: boom/);
  });
});

describe('parseTuning: version 0 migration', () => {
  const v0 = {
    version: 0,
    temperatureCelsius: 5,
    dopplerFactor: 0.5,
    slowMotionScale: 0.2,
    groups: {
      effects: { policy: 'follow-time', pitch: [[0, 0], [1, 1]], tone: [[0, 2000], [1, 20000]], level: [[0, -6], [1, 0]], doppler: true, priority: 90 },
    },
  };

  it('migrates flat settings and [x, y] pair curves to version 1', () => {
    const t = parseTuning(v0);
    expect(t.version).toBe(1);
    expect(t.air.temperatureCelsius).toBe(5);
    expect(t.doppler.factor).toBe(0.5);
    expect(t.doppler.maxShiftCents).toBe(defaultTuning.doppler.maxShiftCents);
    expect(t.timeFlow.slowMotionScale).toBe(0.2);
    expect(t.groups.effects.tone).toEqual({ interpolation: 'linear', keys: [{ x: 0, y: 2000 }, { x: 1, y: 20000 }] });
    expect(Object.keys(t.groups)).toEqual(['effects']);
  });

  it('reports problems of a version 0 file at its own paths', () => {
    const bad = JSON.parse(JSON.stringify(v0));
    bad.groups.effects.pitch = [[0, 0], [2, 1], [1, 2]];
    bad.dopplerFactor = 50;
    const issues = issuesOf(bad);
    expect(issues.map((i) => i.path).sort()).toEqual(['dopplerFactor', 'groups.effects.pitch[2][0]']);
  });

  it('rejects version 1 sections inside a version 0 file', () => {
    expect(issuesOf({ version: 0, doppler: {} })[0].path).toBe('doppler');
  });
});

describe('serializeTuning', () => {
  it('round-trips the built-in tuning exactly and is stable', () => {
    const text = serializeTuning(defaultTuning);
    const back: Tuning = parseTuning(text);
    expect(back).toEqual(defaultTuning);
    expect(serializeTuning(back)).toBe(text);
    expect(text.endsWith('}\n')).toBe(true);
  });

  it('writes keys in the documented order regardless of input order', () => {
    const shuffled = parseTuning(JSON.parse(JSON.stringify({ groups: defaultTuning.groups, master: defaultTuning.master, version: 1 })));
    expect(serializeTuning(shuffled)).toBe(serializeTuning(defaultTuning));
    expect(Object.keys(JSON.parse(serializeTuning(defaultTuning)))).toEqual(['version', 'air', 'doppler', 'distance', 'timeFlow', 'smoothing', 'resampler', 'master', 'groups']);
  });

  it('refuses to serialise an invalid tuning', () => {
    const bad = { ...defaultTuning, doppler: { ...defaultTuning.doppler, factor: Number.NaN } };
    expect(() => serializeTuning(bad)).toThrow(TuningError);
  });
});
