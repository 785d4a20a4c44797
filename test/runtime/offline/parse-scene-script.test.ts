import { describe, expect, it } from 'vitest';
import { parseSceneScript } from '../../../runtime/offline/parse-scene-script';
import { ScriptError } from '../../../runtime/offline/script-error';

const minimal = {
  duration: 2,
  sounds: { hum: { type: 'hum', frequency: 440 } },
  sources: { car: { motion: { type: 'line', from: [-40, 0, -10], velocity: [40, 0, 0] } } },
  voices: [{ sound: 'hum', source: 'car', loop: true }],
};

function issuesOf(json: unknown): { path: string; message: string }[] {
  try {
    parseSceneScript(json);
  } catch (e) {
    expect(e).toBeInstanceOf(ScriptError);
    return [...(e as ScriptError).issues];
  }
  throw new Error('expected a ScriptError');
}

describe('parseSceneScript', () => {
  it('fills the documented defaults', () => {
    const s = parseSceneScript(minimal);
    expect(s.sampleRate).toBe(48000);
    expect(s.velocities).toBe('exact');
    expect(s.snapshotRate).toBe(60);
    expect(s.tuning).toBeNull();
    expect(s.listener.forward).toEqual([0, 0, -1]);
    expect(s.voices[0]).toMatchObject({ gain: 1, ratio: 1, start: 0, stop: null, group: null, loop: true });
    expect(s.sounds.hum).toMatchObject({ type: 'hum', seconds: 2, gain: 0.5 });
  });

  it('keeps an inline tuning object and a tuning path apart', () => {
    expect(parseSceneScript({ ...minimal, tuning: 'slow.tuning.json' }).tuning).toEqual({ path: 'slow.tuning.json' });
    expect(parseSceneScript({ ...minimal, tuning: { version: 1 } }).tuning).toEqual({ inline: { version: 1 } });
  });

  it.each([
    ['a non-object document', 42, '', /expected an object/],
    ['a missing duration', { ...minimal, duration: undefined }, 'duration', /missing/],
    ['a negative duration', { ...minimal, duration: -1 }, 'duration', /\(0, 3600\]/],
    ['an unknown sound in a voice', { ...minimal, voices: [{ sound: 'horn' }] }, 'voices[0].sound', /no sound named "horn"/],
    ['an unknown source in a voice', { ...minimal, voices: [{ sound: 'hum', source: 'truck' }] }, 'voices[0].source', /no source named "truck"/],
    ['a bad vector', { ...minimal, sources: { car: { motion: { type: 'line', from: [0, 0], velocity: [1, 0, 0] } } } }, 'sources.car.motion.from', /\[x, y, z\]/],
    ['an unknown motion type', { ...minimal, sources: { car: { motion: { type: 'spiral' } } } }, 'sources.car.motion.type', /"fixed", "line"/],
    ['keyframes out of order', { ...minimal, sources: { car: { motion: { type: 'keyframes', keys: [{ time: 1, position: [0, 0, 0] }, { time: 0.5, position: [1, 0, 0] }] } } } }, 'sources.car.motion.keys[1].time', /increase strictly/],
    ['a time-scale target above 4', { ...minimal, timeScale: [{ time: 0, target: 5 }] }, 'timeScale[0].target', /\[0, 4\]/],
    ['an unknown easing', { ...minimal, timeScale: [{ time: 0, target: 0.5, easing: 'bouncy' }] }, 'timeScale[0].easing', /"linear"/],
    ['a misspelt field', { ...minimal, voices: [{ sound: 'hum', gian: 2 }] }, 'voices[0].gian', /unknown field/],
    ['stop before start', { ...minimal, voices: [{ sound: 'hum', start: 2, stop: 1 }] }, 'voices[0].stop', /before start/],
    ['an all-zero partial list', { ...minimal, sounds: { hum: { type: 'hum', frequency: 100, partials: [0, 0] } } }, 'sounds.hum.partials', /not all zero/],
    ['a fractional noise seed', { ...minimal, sounds: { hum: { type: 'noise', seed: 1.5 } } }, 'sounds.hum.seed', /integer/],
  ])('reports %s with its JSON path', (_name, json, path, pattern) => {
    const issues = issuesOf(json);
    const hit = issues.find((i) => i.path === path);
    expect(hit, JSON.stringify(issues)).toBeDefined();
    expect(hit!.message).toMatch(pattern);
  });

  it('lists every problem of a document, not only the first', () => {
    const issues = issuesOf({ duration: 0, voices: [{ sound: 'a' }, { sound: 'b' }] });
    expect(issues.map((i) => i.path)).toEqual(['duration', 'voices[0].sound', 'voices[1].sound']);
  });
});

describe('docs/cli.md scene script example', () => {
  it('parses the scene script shown in docs/cli.md', async () => {
    const { readFileSync } = await import('node:fs');
    const { resolve } = await import('node:path');
    const readme = readFileSync(resolve(__dirname, '../../../docs/cli.md'), 'utf8');
    const section = readme.slice(readme.indexOf('## Scene scripts'));
    const json = section.slice(section.indexOf('```json') + 7, section.indexOf('```', section.indexOf('```json') + 7));
    const s = parseSceneScript(JSON.parse(json));
    expect(s.voices[0].group).toBe('vehicles');
    expect(s.timeScale[0].target).toBe(0.5);
  });
});
