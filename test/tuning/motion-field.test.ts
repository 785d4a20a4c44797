// The fields added for propagation load from older files: a group's `motion` (from its `doppler` boolean) and the
// air's humidity and pressure (ISO 9613-1 reference values, docs/references.md §6).
import { describe, expect, it } from 'vitest';
import { defaultTuning, parseTuning, serializeTuning } from '../../src/tuning';
import { CompiledGroup } from '../../src/dilation';

/** A version-1 document as files were written before these fields existed. */
function olderFile(): Record<string, any> {
  const doc = JSON.parse(serializeTuning(defaultTuning));
  delete doc.air.relativeHumidity;
  delete doc.air.pressureKilopascals;
  for (const g of Object.values(doc.groups) as Record<string, unknown>[]) delete g.motion;
  return doc;
}

describe('tuning fields added for propagation', () => {
  it('loads an older file: groups with Doppler on propagate, air at 50 % and 101.325 kPa', () => {
    const t = parseTuning(olderFile());
    expect(t.groups.effects.motion).toBe('propagation');
    expect([t.air.relativeHumidity, t.air.pressureKilopascals]).toEqual([50, 101.325]);
  });

  it.each([
    [true, 'propagation', 'propagation'],
    [true, 'instant', 'instant'],
    [true, 'off', 'off'],
    [false, 'propagation', 'off'],
    [false, 'instant', 'off'],
  ] as const)('doppler %s with motion %s plays as %s', (doppler, motion, heard) => {
    const doc = olderFile();
    doc.groups.effects.doppler = doppler;
    doc.groups.effects.motion = motion;
    expect(new CompiledGroup('effects', parseTuning(doc).groups.effects).motion).toBe(heard);
  });

  it('refuses an unknown motion model, naming the path', () => {
    const doc = olderFile();
    doc.groups.effects.motion = 'teleport';
    expect(() => parseTuning(doc)).toThrow(/groups\.effects\.motion/);
  });
});
