// Undo/redo over whole tuning documents.
import { describe, expect, it } from 'vitest';
import { TuningHistory } from '../../editor/tuning-history';
import { diffTunings, diffValueText } from '../../editor/tuning-diff';

describe('TuningHistory', () => {
  it('undoes and redoes edits, loads and resets in order, and a new edit drops the redo branch', () => {
    const h = new TuningHistory({ text: 'a', what: 'start' });
    expect(h.canUndo).toBe(false);
    h.push({ text: 'b', what: 'edit' });
    h.push({ text: 'c', what: 'load x.json' });
    h.push({ text: 'd', what: 'reset' });
    expect(h.undoWhat).toBe('reset');
    expect(h.undo()?.text).toBe('c');
    expect(h.undo()?.text).toBe('b');
    expect(h.redoWhat).toBe('load x.json');
    expect(h.redo()?.text).toBe('c');
    h.push({ text: 'e', what: 'edit' });
    expect(h.canRedo).toBe(false);
    expect(h.undo()?.text).toBe('c');
    expect(h.undo()?.text).toBe('b');
    expect(h.undo()?.text).toBe('a');
    expect(h.undo()).toBeNull();
  });

  it('does not record a step that changes nothing', () => {
    const h = new TuningHistory({ text: 'a', what: 'start' });
    expect(h.push({ text: 'a', what: 'edit' })).toBe(false);
    expect(h.canUndo).toBe(false);
  });

  it('keeps at most its limit of entries, dropping the oldest', () => {
    const h = new TuningHistory({ text: '0', what: 'start' }, { limit: 3 });
    for (let i = 1; i <= 5; i++) h.push({ text: String(i), what: 'edit' });
    expect(h.undo()?.text).toBe('4');
    expect(h.undo()?.text).toBe('3');
    expect(h.undo()).toBeNull();
  });
});

describe('diffTunings', () => {
  it('lists differing leaves by JSON path, curve keys element by element, and groups only on one side', () => {
    const a = { doppler: { factor: 1 }, groups: { fx: { pitch: { keys: [{ x: 0, y: 0 }, { x: 1, y: 1 }] } }, old: { priority: 1 } } };
    const b = { doppler: { factor: 2 }, groups: { fx: { pitch: { keys: [{ x: 0, y: 0 }, { x: 1, y: 0.5 }, { x: 2, y: 2 }] } }, neu: { priority: 3 } } };
    expect(diffTunings(a, b).map((d) => [d.path, diffValueText(d.a), diffValueText(d.b)])).toEqual([
      ['doppler.factor', '1', '2'],
      ['groups.fx.pitch.keys[1].y', '1', '0.5'],
      ['groups.fx.pitch.keys[2]', '–', '{"x":2,"y":2}'],
      ['groups.old', '{"priority":1}', '–'],
      ['groups.neu', '–', '{"priority":3}'],
    ]);
    expect(diffTunings(a, JSON.parse(JSON.stringify(a)))).toEqual([]);
  });
});
