// @vitest-environment jsdom
// The editor under malformed tuning files and audio-thread errors, in a jsdom document over a Ralenti whose worklet
// node is a fake: a refused file leaves the running tuning, the commands sent and every displayed value unchanged,
// and lists the problem's JSON path; audio-thread errors reported in the stats appear in the readouts.
import { describe, expect, it, vi } from 'vitest';
import { EditorPanel } from '../../editor/index';
import { Ralenti, defaultTuning } from '../../runtime/index';
import { FakeWorkletNode } from '../runtime/fake-worklet-node';
import { malformedCorpus } from './tuning-corpus';

function fakeParam(value: number) {
  return { value, setTargetAtTime: () => undefined, cancelScheduledValues: () => undefined, setValueAtTime: () => undefined };
}
function fakeNode(extra: Record<string, unknown> = {}) {
  return { connect: () => undefined, disconnect: () => undefined, ...extra };
}

function setup() {
  const context = {
    currentTime: 0,
    sampleRate: 48000,
    createAnalyser: () => fakeNode({ fftSize: 2048, frequencyBinCount: 1024, smoothingTimeConstant: 0, minDecibels: -100, maxDecibels: -30, getFloatFrequencyData: () => undefined }),
    createGain: () => fakeNode({ gain: fakeParam(1) }),
    createBiquadFilter: () => fakeNode({ frequency: fakeParam(20000), Q: fakeParam(0.7), type: 'lowpass' }),
    createStereoPanner: () => fakeNode({ pan: fakeParam(0) }),
    createBufferSource: () => fakeNode({ playbackRate: fakeParam(1), start: () => undefined, stop: () => undefined, buffer: null, loop: false }),
  } as unknown as BaseAudioContext;
  const node = new FakeWorkletNode();
  const ralenti = new Ralenti({ context, node: node as unknown as AudioWorkletNode, tuning: defaultTuning, capacity: 8 });
  const container = document.createElement('div');
  document.body.appendChild(container);
  const gain = () => fakeNode({ gain: fakeParam(0.125) }) as unknown as GainNode;
  const panel = new EditorPanel({ ralenti, container, master: gain(), engineBus: gain(), voices: [], comparison: [] });
  return { panel, ralenti, node, container };
}

/** Every value the panel shows: inputs, selects and readout texts. */
function displayed(container: HTMLElement): string {
  const values = [...container.querySelectorAll('input, select, textarea')].map((e) => (e as HTMLInputElement).value);
  const curves = [...container.querySelectorAll('svg path, svg circle')].map((e) => e.getAttribute('d') ?? `${e.getAttribute('cx')},${e.getAttribute('cy')}`);
  return JSON.stringify({ values, curves });
}

describe('editor under malformed tuning files', () => {
  it('keeps the running tuning, sends nothing and shows the same values for every refused file, listing its path', () => {
    const { panel, ralenti, node, container } = setup();
    const before = displayed(container);
    expect(before.length).toBeGreaterThan(100);
    const texts = malformedCorpus
      .map((c) => {
        const input = c.input();
        if (typeof input === 'string') return { c, text: input };
        try {
          const text = JSON.stringify(input);
          return typeof text === 'string' && JSON.parse(text) !== null ? { c, text } : null;
        } catch {
          return null;
        }
      })
      .filter((x): x is NonNullable<typeof x> => x !== null);
    expect(texts.length).toBeGreaterThan(50);
    let refused = 0;
    for (const { c, text } of texts) {
      const ok = panel.loadText(text, 'bad.json');
      if (ok) continue; // JSON text lost what made it malformed (NaN → null …) and it became valid: not this test's case
      refused++;
      expect(ralenti.tuning, c.name).toBe(defaultTuning);
      expect(panel.lastProblems.length, c.name).toBeGreaterThan(0);
      const status = container.ownerDocument.querySelector('.rl-file-status')!.textContent!;
      expect(status, c.name).toContain('the running tuning is unchanged');
      expect(status, c.name).toContain(panel.lastProblems[0].path === '' ? '(document)' : panel.lastProblems[0].path);
      expect(displayed(container), c.name).toBe(before);
    }
    // Every file reached the refusal checks (a file that became valid would also have sent a tuning, failing below).
    expect(refused).toBe(texts.length);
    expect(node.commands('tuning')).toEqual([]);
    panel.dispose();
  });

  it('shows audio-thread errors reported by the worklet in the readouts', () => {
    vi.useFakeTimers(); // the readouts are tweakpane monitors, refreshed by its interval ticker
    const { panel, node, container, ralenti } = setup();
    node.deliver({ type: 'error', where: 'process', message: 'the engine failed while rendering', count: 3 });
    node.deliver({ type: 'stats', contextTime: 1, stats: { ...ralenti.stats, errors: 3 }, voices: [] });
    panel.update();
    vi.advanceTimersByTime(1000);
    const text = [...container.querySelectorAll('input')].map((e) => (e as HTMLInputElement).value);
    const row = [...container.querySelectorAll('.tp-lblv')].find((e) => e.textContent?.includes('audio errors'));
    expect(row).toBeDefined();
    expect(row!.querySelector('input')?.value ?? row!.textContent).toContain('3');
    expect(text.length).toBeGreaterThan(0);
    panel.dispose();
    vi.useRealTimers();
  });

  it('shows the text of the last audio-thread error, keeps it across a tuning reload, and stops listening when disposed', () => {
    const { panel, node, container, ralenti } = setup();
    const line = () => container.querySelector('.rl-audio-error')!.textContent;
    panel.update();
    expect(line()).toBe('last audio error: none');
    node.deliver({ type: 'error', where: 'command', message: 'play: unknown sound 99', count: 1 });
    node.deliver({ type: 'error', where: 'process', message: 'the engine failed while rendering (1 so far); silent until the next command', count: 2 });
    panel.update();
    expect(line()).toBe('last audio error (process): the engine failed while rendering (1 so far); silent until the next command');
    expect(container.querySelector('.rl-audio-error-on')).not.toBeNull();
    // A good file rebuilds the panel; the error stays on show.
    expect(panel.loadText(JSON.stringify({ ...JSON.parse(JSON.stringify(defaultTuning)) }), 'good.json')).toBe(true);
    panel.update();
    expect(line()).toContain('the engine failed while rendering');
    node.onprocessorerror?.();
    panel.update();
    expect(line()).toBe('last audio error (processorerror): the processor failed and stopped');
    const listeners = (ralenti as unknown as { life: { errorListeners: Set<unknown> } }).life.errorListeners;
    expect(listeners.size).toBe(1);
    panel.dispose();
    expect(listeners.size).toBe(0);
  });
});
