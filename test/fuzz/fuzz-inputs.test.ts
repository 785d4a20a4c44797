// Fuzzing the text and file entry points: WAV headers and bytes, tuning text, scene scripts. Each input either
// loads (with sane values) or is refused with the entry point's own typed error; nothing else escapes.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { readWav, writeWav, WavError, parseSceneScript, ScriptError, WAV_SAMPLE_BOUND } from '../../runtime/offline';
import { parseTuning, serializeTuning, defaultTuning, TuningError } from '../../src/tuning';
import { fuzz } from './fuzz-harness';

const RUNS = 400;

/** A valid WAV with random header fields and bytes overwritten at random offsets. */
const wavBytes = fc
  .record({
    encoding: fc.constantFrom('pcm16' as const, 'pcm24' as const, 'float32' as const),
    channels: fc.integer({ min: 1, max: 3 }),
    frames: fc.integer({ min: 0, max: 64 }),
    edits: fc.array(fc.tuple(fc.integer({ min: 0, max: 80 }), fc.integer({ min: 0, max: 255 })), { maxLength: 8 }),
    cut: fc.option(fc.integer({ min: 0, max: 300 })),
  })
  .map(({ encoding, channels, frames, edits, cut }) => {
    const ch = Array.from({ length: channels }, (_, c) => new Float32Array(frames).map((_, i) => Math.sin(i + c)));
    const b = writeWav({ sampleRate: 48000, channels: ch, encoding });
    for (const [at, v] of edits) if (at < b.length) b[at] = v;
    return cut === null ? b : b.subarray(0, cut);
  });

/** Tuning text: the default file with characters replaced, inserted or cut, or arbitrary JSON. */
const base = serializeTuning(defaultTuning);
const tuningText = fc.oneof(
  fc.array(fc.tuple(fc.nat(base.length), fc.nat(3), fc.constantFrom('', '"', '{', '}', ',', '1', '-', 'e9', 'null', '[]', '"x":1,', '"version":1,')), { minLength: 1, maxLength: 4 }).map((edits) => {
    let t = base;
    for (const [at, del, ins] of edits) t = t.slice(0, at % (t.length + 1)) + ins + t.slice((at % (t.length + 1)) + del);
    return t;
  }),
  fc.json({ maxDepth: 4 }),
);

const example = JSON.parse(readFileSync('runtime/offline/examples/slow-motion.json', 'utf8'));
/** A scene script: the example with random fields replaced by arbitrary JSON values, or arbitrary JSON. */
const sceneDoc = fc.oneof(
  fc.array(fc.tuple(fc.constantFrom('duration', 'sampleRate', 'sounds', 'voices', 'timeScale', 'listener', 'sources', 'tuning', 'velocities', 'snapshotRate'), fc.jsonValue({ maxDepth: 3 })), { maxLength: 3 }).map((edits) => {
    const doc = structuredClone(example);
    for (const [k, v] of edits) doc[k] = v;
    return doc;
  }),
  fc.jsonValue({ maxDepth: 4 }),
);

describe('fuzz: input files and text', () => {
  it(`WAV bytes: ${RUNS} mutated files load with sane values or are refused with WavError`, async () => {
    const c = await fuzz('WAV headers and bytes', wavBytes, RUNS, 1801, (b) => {
      try {
        const w = readWav(b);
        if (!(w.sampleRate >= 8000 && w.sampleRate <= 384000 && Number.isInteger(w.sampleRate))) return `rate ${w.sampleRate}`;
        for (const ch of w.channels) for (const v of ch) if (!(Math.abs(v) <= WAV_SAMPLE_BOUND)) return `sample ${v}`;
      } catch (e) {
        if (!(e instanceof WavError)) throw e;
      }
    });
    expect(c.failures).toBe(0);
  });

  it(`tuning text: ${RUNS} edited or arbitrary documents load frozen or are refused with TuningError`, async () => {
    const c = await fuzz('tuning text', tuningText, RUNS, 1802, (t) => {
      try {
        const tuning = parseTuning(t);
        if (!Object.isFrozen(tuning) || !Object.isFrozen(tuning.master)) return 'not frozen';
      } catch (e) {
        if (!(e instanceof TuningError)) throw e;
        if (e.issues.length === 0) return 'TuningError without issues';
      }
    });
    expect(c.failures).toBe(0);
  });

  it(`scene scripts: ${RUNS} edited or arbitrary documents parse or are refused with ScriptError`, async () => {
    const c = await fuzz('scene scripts', sceneDoc, RUNS, 1803, (doc) => {
      try {
        const s = parseSceneScript(doc);
        if (!(s.duration > 0 && s.duration <= 3600) || !Number.isInteger(s.sampleRate)) return `accepted duration ${s.duration} rate ${s.sampleRate}`;
      } catch (e) {
        if (!(e instanceof ScriptError)) throw e;
      }
    });
    expect(c.failures).toBe(0);
  });
});
