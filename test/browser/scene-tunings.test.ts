// The sample scene survives any valid tuning: restored with a tuning that holds only the required 'effects' group,
// it starts audio, plays every voice (in 'effects'), plays its interface clicks from the frame loop, and logs nothing.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { browserSuiteMode } from './browser-harness';
import { openScenePage, waitForState, type ScenePage } from './scene-page';
import { AUTOSAVE_KEY } from '../../editor/tuning-store';
import { defaultTuning, serializeTuning } from '../../src/tuning';

const mode = browserSuiteMode();
if (mode === 'skip') console.warn('scene tunings browser suite skipped: /usr/bin/chromium is absent and CI is not set');

type Handle = { ready: boolean; error: string | null; voices: { name: string; group: string }[]; tuningJson: string | null; stats: { steals: number } | null };
const handle = (page: Page) =>
  page.evaluate(() => {
    const h = (window as unknown as { ralentiScene: Handle }).ralentiScene;
    return { ready: h.ready, error: h.error, voices: h.voices.map((v) => ({ name: v.name, group: v.group })), tuningJson: h.tuningJson, stats: h.stats };
  });

/** The default tuning with every group but 'effects' removed: valid, and the smallest a designer can save. */
function effectsOnly(): string {
  const t = JSON.parse(serializeTuning(defaultTuning));
  t.groups = { effects: t.groups.effects };
  return JSON.stringify(t);
}

describe.skipIf(mode === 'skip')('sample scene with a tuning of only "effects"', () => {
  let scene: ScenePage | null = null;
  const work = mkdtempSync(join(tmpdir(), 'ralenti-scene-tunings-'));

  beforeAll(async () => {
    if (mode === 'fail') throw new Error('CI is set but /usr/bin/chromium is missing');
    scene = await openScenePage(work, { width: 1024, height: 640 });
    await scene.page.evaluate(([k, v]) => localStorage.setItem(k, v), [AUTOSAVE_KEY, effectsOnly()] as const);
    await scene.page.reload();
  }, 90_000);

  afterAll(async () => {
    await scene?.close();
    rmSync(work, { recursive: true, force: true });
  });

  it('starts, plays every voice in "effects" and keeps its frame loop running through interface clicks', async () => {
    const page = scene!.page;
    await page.click('#start-button');
    const started = await waitForState(page, handle, 'audio to start', (h) => h.ready || h.error !== null, 20_000, 100);
    expect(started.error).toBeNull();
    const playing = await waitForState(page, handle, 'five voices', (h) => h.voices.length >= 5, 8000, 100);
    expect(new Set(playing.voices.map((v) => v.group))).toEqual(new Set(['effects']));
    expect(Object.keys(JSON.parse(playing.tuningJson!).groups)).toEqual(['effects']);
    // The frame loop plays a click every 2 s of wall time: after 2.5 s it has run past at least one.
    await page.waitForTimeout(2500);
    const after = await handle(page);
    expect(after.error).toBeNull();
    expect(scene!.consoleErrors).toEqual([]);
  });
});
