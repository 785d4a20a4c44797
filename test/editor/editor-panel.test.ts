// @vitest-environment jsdom
// The built panel against the format: one field per tuning value with the format's range in its tooltip; reset and
// load ask before replacing unsaved edits; undo covers them.
import { afterEach, describe, expect, it } from 'vitest';
import { EditorPanel } from '../../editor/index';
import { sectionFieldSpecs, tooltipOf } from '../../editor/field-specs';
import { Ralenti, defaultTuning, serializeTuning } from '../../runtime/index';
import { FakeWorkletNode } from '../runtime/fake-worklet-node';

function fakeNode(extra: Record<string, unknown> = {}) {
  return { connect: () => undefined, disconnect: () => undefined, ...extra };
}

function setup(confirmAnswer = true) {
  const context = {
    currentTime: 0,
    sampleRate: 48000,
    createAnalyser: () => fakeNode({ fftSize: 2048, frequencyBinCount: 1024, smoothingTimeConstant: 0, minDecibels: -100, maxDecibels: -30, getFloatFrequencyData: () => undefined }),
  } as unknown as BaseAudioContext;
  const node = new FakeWorkletNode();
  const ralenti = new Ralenti({ context, node: node as unknown as AudioWorkletNode, tuning: defaultTuning, capacity: 16 });
  const container = document.createElement('div');
  document.body.appendChild(container);
  const asked: string[] = [];
  const panel = new EditorPanel({ ralenti, container, confirm: (m) => (asked.push(m), confirmAnswer) });
  return { panel, ralenti, container, asked };
}

afterEach(() => {
  document.body.innerHTML = '';
});

describe('EditorPanel', () => {
  it('has a field for every value of every section of the format, its tooltip giving the format’s range', () => {
    const { container } = setup();
    for (const spec of sectionFieldSpecs) {
      const el = container.querySelector<HTMLElement>(`[data-field="${spec.path}"]`);
      expect(el, spec.path).not.toBeNull();
      expect(el!.title, spec.path).toBe(tooltipOf(spec));
    }
  });

  it('asks before reset replaces unsaved edits, does nothing when declined, and undo brings the edits back', () => {
    const declined = setup(false);
    const edited = structuredClone(JSON.parse(serializeTuning(defaultTuning)));
    edited.doppler.factor = 3;
    declined.panel.loadText(JSON.stringify(edited), 'mine.json');
    expect(declined.asked).toEqual([]); // nothing unsaved yet
    const t = JSON.parse(serializeTuning(declined.ralenti.tuning));
    t.doppler.factor = 4;
    declined.ralenti.setTuning(t);
    declined.panel.session.commit(serializeTuning(declined.ralenti.tuning), 'edit');
    expect(declined.panel.reset()).toBe(false);
    expect(declined.asked[0]).toContain('Reset to the built-in tuning?');
    expect(declined.ralenti.tuning.doppler.factor).toBe(4);

    document.body.innerHTML = '';
    const { panel, ralenti, asked } = setup(true);
    panel.loadText(JSON.stringify(edited), 'mine.json');
    const u = JSON.parse(serializeTuning(ralenti.tuning));
    u.doppler.factor = 5;
    ralenti.setTuning(u);
    panel.session.commit(serializeTuning(ralenti.tuning), 'edit');
    expect(panel.reset()).toBe(true);
    expect(asked).toHaveLength(1);
    expect(ralenti.tuning.doppler.factor).toBe(1);
    panel.undo();
    expect(ralenti.tuning.doppler.factor).toBe(5);
    panel.undo();
    expect(ralenti.tuning.doppler.factor).toBe(3);
    panel.undo();
    expect(ralenti.tuning.doppler.factor).toBe(1);
    panel.redo();
    expect(ralenti.tuning.doppler.factor).toBe(3);
  });

  it('plays tuning A (the saved one) and B (the edits) on request', () => {
    const { panel, ralenti } = setup();
    const t = JSON.parse(serializeTuning(ralenti.tuning));
    t.timeFlow.slowMotionScale = 0.2;
    ralenti.setTuning(t);
    panel.session.commit(serializeTuning(ralenti.tuning), 'edit');
    panel.listenTo('A');
    expect(ralenti.tuning.timeFlow.slowMotionScale).toBe(0.35);
    panel.listenTo('B');
    expect(ralenti.tuning.timeFlow.slowMotionScale).toBe(0.2);
  });

  it('saves back into the file it was opened from through its File System Access handle, and is then not dirty', async () => {
    const { panel, ralenti } = setup();
    const written: string[] = [];
    const handle = {
      name: 'level-3.json',
      getFile: async () => new File([''], 'level-3.json'),
      createWritable: async () => {
        let text = '';
        return { write: async (d: string) => void (text += d), close: async () => void written.push(text) };
      },
    };
    panel.loadText(serializeTuning(defaultTuning), 'level-3.json', handle);
    const t = JSON.parse(serializeTuning(ralenti.tuning));
    t.master.gainDb = -3;
    ralenti.setTuning(t);
    panel.session.commit(serializeTuning(ralenti.tuning), 'edit');
    expect(panel.session.dirty).toBe(true);
    await panel.save();
    expect(written).toEqual([serializeTuning(ralenti.tuning)]);
    expect(panel.session.dirty).toBe(false);
  });
});
