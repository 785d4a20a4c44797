import { describe, expect, it } from 'vitest';
import { loadScene } from '../../../runtime/offline/render-scene';
import { parseSceneScript } from '../../../runtime/offline/parse-scene-script';

// A raw document that spells out every top-level field (as recorded fly-throughs do) with an inline tuning.
const raw = {
  version: 1,
  duration: 1,
  sampleRate: 16000,
  velocities: 'exact',
  snapshotRate: 60,
  tuning: { version: 1, air: { temperatureCelsius: 0, speedOfSound: 300 } },
  sounds: { hum: { type: 'hum', frequency: 200, seconds: 1 } },
  sources: {},
  listener: { motion: { type: 'fixed', position: [0, 0, 0] }, forward: [0, 0, -1], up: [0, 1, 0] },
  timeScale: [],
  voices: [{ sound: 'hum' }],
};

describe('loadScene', () => {
  it('parses a raw document that spells out every field, inline tuning included', () => {
    const loaded = loadScene(raw);
    expect(loaded.tuning.air.speedOfSound).toBe(300);
    expect(loaded.script.voices[0].gain).toBe(1);
  });

  it('takes an already parsed script as it is', () => {
    const loaded = loadScene(parseSceneScript(raw));
    expect(loaded.tuning.air.speedOfSound).toBe(300);
  });
});
