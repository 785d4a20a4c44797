// Malformed tuning files: every case of the corpus is refused with a TuningError naming its JSON path, the input
// is not mutated, no prototype is polluted, and whatever was running (engine, runtime, worklet host) keeps its tuning.
import { describe, expect, it } from 'vitest';
import { defaultTuning, parseTuning, serializeTuning, TuningError, type Tuning } from '../../src/tuning';
import { Engine } from '../../src/engine';
import { Ralenti } from '../../runtime/index';
import { EngineHost } from '../../runtime/worklet/engine-host';
import type { Report } from '../../runtime/protocol';
import { readTuningText } from '../../editor/tuning-store';
import { FakeWorkletNode, fakeContext } from '../runtime/fake-worklet-node';
import { baseDoc, malformedCorpus } from './tuning-corpus';

const prototypes = [Object.prototype, Array.prototype, Function.prototype, String.prototype, Number.prototype];

/** Own property names and descriptors of the built-in prototypes, to compare before and after. */
function prototypeState(): string {
  return JSON.stringify(prototypes.map((p) => Object.getOwnPropertyNames(p).sort()));
}

function firstIssues(input: unknown): { error: unknown; paths: string[]; messages: string[] } {
  try {
    parseTuning(input);
  } catch (error) {
    const issues = error instanceof TuningError ? error.issues : [];
    return { error, paths: issues.map((i) => i.path), messages: issues.map((i) => i.message) };
  }
  return { error: undefined, paths: [], messages: [] };
}

/** A clone that keeps what JSON cannot (undefined, NaN, functions, BigInt) so that mutation can be detected. */
function snapshotOf(v: unknown): string {
  const seen = new WeakSet<object>();
  return JSON.stringify(v, (_k, x) => {
    if (typeof x === 'number' && !Number.isFinite(x)) return `#${x}`;
    if (typeof x === 'bigint') return `#${x}n`;
    if (typeof x === 'function' || x === undefined) return `#${typeof x}`;
    if (x && typeof x === 'object') {
      if (seen.has(x)) return '#seen';
      seen.add(x);
      if (x instanceof Date) return `#date`;
      const own: Record<string, unknown> = {};
      for (const key of Object.getOwnPropertyNames(x)) {
        const d = Object.getOwnPropertyDescriptor(x, key)!;
        own[key] = 'value' in d ? d.value : '#getter';
      }
      return Array.isArray(x) ? Object.values(own).slice(0, -1) : own; // arrays: drop 'length'
    }
    return x;
  });
}

describe('malformed tuning corpus', () => {
  it('holds at least 50 distinct cases', () => {
    expect(malformedCorpus.length).toBeGreaterThanOrEqual(50);
    expect(new Set(malformedCorpus.map((c) => c.name)).size).toBe(malformedCorpus.length);
  });

  it.each(malformedCorpus.map((c) => [c.name, c] as const))('refuses %s with a TuningError at its JSON path, mutating nothing', (_name, c) => {
    const before = prototypeState();
    const input = c.input();
    const inputBefore = typeof input === 'object' && input !== null && !(input instanceof Date) && !hasThrowingGetter(input) ? snapshotOf(input) : null;
    const defaultBefore = serializeTuning(defaultTuning);
    const { error, paths, messages } = firstIssues(input);
    expect(error).toBeInstanceOf(TuningError);
    expect(paths[0]).toBe(c.path);
    expect(messages.every((m) => m.length > 5)).toBe(true);
    expect((error as Error).message).toContain(c.path === '' ? '(document)' : c.path);
    expect(paths.length).toBeLessThanOrEqual(100);
    if (inputBefore !== null) expect(snapshotOf(input)).toBe(inputBefore);
    expect(serializeTuning(defaultTuning)).toBe(defaultBefore);
    expect(prototypeState()).toBe(before);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    expect(Object.prototype.hasOwnProperty.call(Object.prototype, 'polluted')).toBe(false);
  });

  it('gives the editor the same paths when the corpus arrives as file text', () => {
    let checked = 0;
    for (const c of malformedCorpus) {
      const input = c.input();
      if (typeof input === 'string') {
        const r = readTuningText(input);
        expect(r.ok, c.name).toBe(false);
        if (!r.ok) expect(r.problems[0].path, c.name).toBe(c.path);
        checked++;
        continue;
      }
      let textForm: string;
      try {
        textForm = JSON.stringify(input);
      } catch {
        continue; // BigInt, throwing getters: no file can hold these
      }
      if (textForm === undefined || /#|undefined/.test(c.name)) continue;
      const r = readTuningText(textForm);
      // JSON text cannot carry NaN/Infinity/undefined/functions (stringify drops or nulls them): such files are refused too, maybe at a neighbour path.
      expect(r.ok, c.name).toBe(false);
      checked++;
    }
    // All but the few that no file can hold (BigInt, throwing getters, undefined) were checked: 94 of 97 when written.
    expect(checked).toBeGreaterThanOrEqual(malformedCorpus.length - 5);
  });

  it('caps the issue list at 100 for a document with thousands of problems', () => {
    const d = baseDoc();
    for (let i = 0; i < 5000; i++) d[`extra${i}`] = i;
    const { error, paths } = firstIssues(d);
    expect(error).toBeInstanceOf(TuningError);
    expect(paths).toHaveLength(100);
  });
});

function hasThrowingGetter(v: object): boolean {
  return Object.values(Object.getOwnPropertyDescriptors(v)).some((d) => d.get !== undefined);
}

/** A valid tuning that differs from the default (so "unchanged" is observable). */
const custom = parseTuning({ ...baseDoc(), master: { limiter: true, ceilingDb: -6, gainDb: -3 }, doppler: { ...baseDoc().doppler, factor: 2 } });

describe('the running tuning survives a malformed file', () => {
  it('in the core engine: a failed parse leaves the engine on its tuning, rendering exactly as before', () => {
    const render = (attempt: boolean) => {
      const e = new Engine({ sampleRate: 48000, tuning: custom });
      const s = e.addSound([new Float32Array(4800).map((_, i) => 0.9 * Math.sin(i / 7))], 48000);
      e.play(s, { loop: true, gain: 2 });
      const l = new Float32Array(128);
      const r = new Float32Array(128);
      const out: number[] = [];
      for (let b = 0; b < 40; b++) {
        if (attempt && b % 4 === 0) {
          const c = malformedCorpus[b % malformedCorpus.length];
          try {
            e.setTuning(parseTuning(c.input()));
          } catch {
            // refused: the engine must not have seen anything
          }
        }
        e.render([l, r], 128);
        out.push(...l);
      }
      return { out, tuning: e.currentTuning };
    };
    const quiet = render(false);
    const tried = render(true);
    expect(tried.tuning).toBe(custom);
    expect(tried.out).toEqual(quiet.out);
  });

  it('in the main-thread runtime: setTuning throws TuningError, keeps the running tuning and sends nothing', () => {
    const node = new FakeWorkletNode();
    const r = new Ralenti({ context: fakeContext(), node: node as unknown as AudioWorkletNode, tuning: custom, capacity: 8 });
    for (const c of malformedCorpus) {
      expect(() => r.setTuning(c.input()), c.name).toThrow(TuningError);
      expect(r.tuning).toBe(custom);
    }
    expect(node.commands('tuning')).toEqual([]);
    // …and a good file still applies afterwards.
    r.setTuning(baseDoc());
    expect(node.commands('tuning')).toHaveLength(1);
  });

  it('in createRalenti: a malformed tuning option rejects with TuningError before any node is built', async () => {
    const built: unknown[] = [];
    const g = globalThis as Record<string, unknown>;
    const saved = g.AudioWorkletNode;
    g.AudioWorkletNode = class {
      constructor(...args: unknown[]) {
        built.push(args);
      }
    };
    const addModule: string[] = [];
    const context = { ...fakeContext(), audioWorklet: { addModule: async (u: string) => void addModule.push(u) } } as unknown as BaseAudioContext;
    try {
      const { createRalenti } = await import('../../runtime/index');
      for (const c of malformedCorpus.slice(0, 20)) {
        await expect(createRalenti(context, { tuning: c.input(), workletUrl: 'x.js' }), c.name).rejects.toBeInstanceOf(TuningError);
      }
    } finally {
      g.AudioWorkletNode = saved;
    }
    expect(built).toEqual([]);
    expect(addModule).toEqual([]);
  });

  it('in the worklet host: a tuning command carrying a malformed document is refused and the engine keeps its tuning', () => {
    const reports: Report[] = [];
    const h = new EngineHost({ sampleRate: 48000, startContextTime: 0, processorOptions: { capacity: 4, maxSounds: 4, tuning: custom, statsIntervalSeconds: 1 }, post: (x) => reports.push(x) });
    const objects = malformedCorpus.map((c) => c.input()).filter((x) => typeof x === 'object' && x !== null && !Array.isArray(x));
    expect(objects.length).toBeGreaterThan(40);
    for (const bad of objects) h.handle({ type: 'tuning', tuning: bad as Tuning });
    expect(h.engine.currentTuning).toEqual(custom);
    expect(reports.filter((x) => x.type === 'error').length).toBeGreaterThan(0);
    const l = new Float32Array(128);
    const r = new Float32Array(128);
    expect(() => h.process([l, r])).not.toThrow();
    expect(h.engine.stats.errors).toBe(0);
  });
});
