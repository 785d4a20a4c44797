// The offline renderer releases its engine's module memory when a render ends (or is abandoned), not at collection.
import { describe, expect, it } from 'vitest';
import { join, resolve } from 'node:path';
import { loadSceneFile, renderLoadedScene, SceneRun } from '../../../runtime/offline';
import { WasmKernel } from '../../../src/dsp';

const examples = resolve(__dirname, '../../../runtime/offline/examples');
const kernel = WasmKernel.shared();

describe('SceneRun and module memory', () => {
  it.runIf(kernel !== null)('hands the engine regions back when the last block is rendered', () => {
    const loaded = loadSceneFile(join(examples, 'flyby.json'));
    const script = { ...loaded.script, duration: 0.5 };
    renderLoadedScene(script, loaded.sounds, loaded.tuning); // places the shared tables of this rate and tier once
    const inUse = kernel!.bytesInUse;
    const run = new SceneRun(script, loaded.sounds, loaded.tuning);
    run.step();
    expect(kernel!.bytesInUse).toBeGreaterThan(inUse);
    while (run.step() > 0);
    expect(kernel!.bytesInUse).toBe(inUse);
  });

  it.runIf(kernel !== null)('hands them back when a render is abandoned with dispose, after which step renders nothing', () => {
    const loaded = loadSceneFile(join(examples, 'flyby.json'));
    const inUse = kernel!.bytesInUse;
    const run = new SceneRun(loaded.script, loaded.sounds, loaded.tuning);
    run.step();
    run.dispose();
    run.dispose();
    expect(kernel!.bytesInUse).toBe(inUse);
    expect(run.step()).toBe(0);
  });
});
