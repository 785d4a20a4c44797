// The sample scene and tuning panel in real Chromium, served by `npm start`'s own server on a random free port.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { Page } from 'playwright-core';
import { browserSuiteMode } from './browser-harness';
import { openScenePage, waitForState, type ScenePage } from './scene-page';

const mode = browserSuiteMode();
if (mode === 'skip') console.warn('editor browser suite skipped: /usr/bin/chromium is absent and CI is not set (apt-get install chromium, or run .ci/run)');

const repo = resolve(__dirname, '../..');
const SECTIONS = ['Time flow', 'Sound groups', 'Doppler & air', 'Live readouts', 'A/B compare', 'Tuning file', 'Listening'];

interface Voice {
  name: string;
  ratioCents: number;
  dopplerCents: number;
}
type Handle = { ready: boolean; error: string | null; timeScale: number; voices: Voice[]; tuningJson: string | null };

const handle = (page: Page) => page.evaluate(() => {
  const h = (window as unknown as { ralentiScene: Handle }).ralentiScene;
  return { ready: h.ready, error: h.error, timeScale: h.timeScale, voices: h.voices, tuningJson: h.tuningJson };
});

const waitFor = (page: Page, what: string, test: (h: Handle) => boolean, timeoutMs = 8000) => waitForState(page, handle, what, test, timeoutMs, 100);

async function startAudio(page: Page): Promise<void> {
  await page.click('#start-button');
  const h = await waitFor(page, 'audio to start', (x) => x.ready || x.error !== null, 20_000);
  expect(h.error).toBeNull();
  await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
}

const voice = (h: Handle, name: string) => h.voices.find((v) => v.name === name);

describe.skipIf(mode === 'skip')('sample scene and tuning panel in Chromium', () => {
  let scene: ScenePage | null = null;
  let page: Page;
  const work = mkdtempSync(join(tmpdir(), 'ralenti-editor-'));
  let consoleErrors: string[] = [];

  beforeAll(async () => {
    if (mode === 'fail') throw new Error('CI is set but /usr/bin/chromium is missing; .ci/run installs it with apt-get install -y chromium');
    scene = await openScenePage(work, { width: 1280, height: 720 });
    page = scene.page;
    consoleErrors = scene.consoleErrors;
    await startAudio(page);
  }, 90_000);

  afterAll(async () => {
    await scene?.close();
    rmSync(work, { recursive: true, force: true });
  });

  it('loads, starts audio after the overlay click and logs no console errors', async () => {
    const h = await waitFor(page, 'five playing voices', (x) => x.voices.length >= 5);
    expect(h.voices.map((v) => v.name)).toEqual(expect.arrayContaining(['drone', 'kart', 'orb', 'generator', 'music']));
    expect(await page.locator('#overlay.gone').count()).toBe(1);
    expect(consoleErrors).toEqual([]);
  });

  it('shows every panel section', async () => {
    const titles = await page.locator('#panel .tp-fldv_t').allTextContents();
    for (const s of SECTIONS) expect(titles).toContain(s);
  });

  it('measures the render load in the worklet and shows it as engine load in the readouts', async () => {
    // Chromium's AudioWorkletGlobalScope has no `performance`: the processor times process() with Date.now.
    const load = await page.waitForFunction(() => (window as unknown as { ralentiScene: { load: { fraction: number; clock: string } | null } }).ralentiScene.load, null, { timeout: 8000 });
    const l = (await load.jsonValue()) as { fraction: number; clock: string; averageSeconds: number };
    expect(['performance.now', 'Date.now']).toContain(l.clock);
    expect(Number.isFinite(l.fraction) && l.fraction >= 0).toBe(true);
    const shown = await page.locator('#panel .tp-lblv', { has: page.locator('.tp-lblv_l', { hasText: /^engine load$/ }) }).locator('input').inputValue();
    expect(shown).toMatch(/^\d+\.\d % · 1 s avg/);
  });

  it('shows every group name in full in the group tabs at 1280×720', async () => {
    const groups = Object.keys(JSON.parse((await handle(page)).tuningJson!).groups as object);
    const tabs = await page.locator('#panel .tp-tbiv_t').evaluateAll((els) =>
      els.map((e) => ({ text: e.textContent ?? '', cut: e.scrollWidth > e.clientWidth, width: e.getBoundingClientRect().width })),
    );
    expect(tabs.map((t) => t.text)).toEqual(groups);
    for (const t of tabs) {
      expect(t.cut, `tab "${t.text}" is cut short`).toBe(false);
      expect(t.width, `tab "${t.text}" has a width`).toBeGreaterThan(0);
    }
  });

  it('moves the time scale to the slow-motion target while Space is held, and back to 1 on release', async () => {
    const target = JSON.parse((await handle(page)).tuningJson!).timeFlow.slowMotionScale as number;
    await page.keyboard.down('Space');
    await waitFor(page, `time scale ${target}`, (x) => Math.abs(x.timeScale - target) < 0.005);
    await page.keyboard.up('Space');
    await waitFor(page, 'time scale 1', (x) => Math.abs(x.timeScale - 1) < 0.005);
  });

  it('changes the voice targets when a pitch-curve key is edited', async () => {
    // The generator (ambience group, stationary, no Doppler) plays at 0 cents at time scale 1.
    await waitFor(page, 'generator at 0 cents', (x) => Math.abs(voice(x, 'generator')?.ratioCents ?? 99) < 1);
    await page.locator('#panel .tp-tbiv', { hasText: 'ambience' }).click();
    const blade = page.locator('[data-curve="ambience · speed & pitch ×"]');
    await blade.locator('circle[data-x="1"]').click();
    await blade.locator('input[aria-label^="value of the selected key"]').fill('0.5');
    await blade.locator('input[aria-label^="value of the selected key"]').press('Enter');
    // Pitch curve value 0.5 at time scale 1 halves the playback ratio: −1200 cents (an octave).
    const h = await waitFor(page, 'generator near −1200 cents', (x) => Math.abs((voice(x, 'generator')?.ratioCents ?? 0) + 1200) < 5);
    const keys = JSON.parse(h.tuningJson!).groups.ambience.pitch.keys as { x: number; y: number }[];
    expect(keys.find((k) => k.x === 1)?.y).toBe(0.5);
  });

  it('moves a curve key dragged with the mouse and applies it to the running tuning', async () => {
    await page.locator('#panel .tp-tbiv', { hasText: 'ambience' }).click();
    const key = page.locator('[data-curve="ambience · level"] circle[data-x="0.35"]');
    await key.scrollIntoViewIfNeeded();
    const box = (await key.boundingBox())!;
    const keysOf = (json: string) => JSON.parse(json).groups.ambience.level.keys as { x: number; y: number }[];
    const before = keysOf((await handle(page)).tuningJson!);
    expect(before.find((k) => k.x === 0.35)?.y).toBe(-2);
    const cx = box.x + box.width / 2;
    const cy = box.y + box.height / 2;
    await page.mouse.move(cx, cy);
    await page.mouse.down();
    for (let i = 1; i <= 5; i++) await page.mouse.move(cx, cy - 6 * i);
    await page.mouse.up();
    // Up the graph is louder: the key's level rises; it keeps its place among the keys.
    const h = await waitFor(page, 'the dragged level key', (x) => keysOf(x.tuningJson!)[1].y > -1.5);
    const after = keysOf(h.tuningJson!);
    expect(after).toHaveLength(before.length);
    expect(after[1].x).toBeGreaterThan(before[0].x);
    expect(after[1].x).toBeLessThan(before[2].x);
    expect(after[0]).toEqual(before[0]);
    expect(after[2]).toEqual(before[2]);
  });

  it('round-trips the tuning through download and load', async () => {
    const before = (await handle(page)).tuningJson!;
    const [download] = await Promise.all([page.waitForEvent('download'), page.locator('#panel button', { hasText: 'Download tuning' }).click()]);
    const file = join(work, 'downloaded.json');
    await download.saveAs(file);
    expect(JSON.parse(readFileSync(file, 'utf8'))).toEqual(JSON.parse(before));
    await page.locator('#panel button', { hasText: 'Reset to built-in' }).click();
    await waitFor(page, 'the reset tuning', (x) => x.tuningJson !== before);
    await page.setInputFiles('#ralenti-tuning-file', file);
    await waitFor(page, 'the loaded tuning', (x) => x.tuningJson === before);
    await expect.poll(() => page.locator('.rl-file-ok').textContent()).toContain('downloaded.json: loaded');
  });

  it('shows a malformed file’s problems by JSON path and keeps the running tuning', async () => {
    const before = (await handle(page)).tuningJson!;
    const bad = JSON.parse(before);
    bad.doppler.factor = 'loud';
    bad.groups.ambience.pitch.keys[0].x = 3;
    await page.setInputFiles('#ralenti-tuning-file', { name: 'bad.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(bad)) });
    await expect.poll(() => page.locator('.rl-file-bad').textContent()).toContain('bad.json: not loaded');
    const paths = await page.locator('.rl-file-problems code').allTextContents();
    expect(paths).toContain('doppler.factor');
    expect(paths.some((p) => p.startsWith('groups.ambience.pitch.keys'))).toBe(true);
    expect((await handle(page)).tuningJson).toBe(before);
    await page.setInputFiles('#ralenti-tuning-file', { name: 'broken.json', mimeType: 'application/json', buffer: Buffer.from('{"version": 1,') });
    await expect.poll(() => page.locator('.rl-file-bad').textContent()).toContain('broken.json: not loaded');
    expect((await handle(page)).tuningJson).toBe(before);
  });

  it('restores the autosaved tuning after a reload', async () => {
    const before = (await handle(page)).tuningJson!;
    expect(JSON.parse(before).groups.ambience.pitch.keys.find((k: { x: number }) => k.x === 1).y).toBe(0.5);
    await page.reload();
    await startAudio(page);
    const h = await waitFor(page, 'the restored tuning', (x) => x.tuningJson !== null);
    expect(h.tuningJson).toBe(before);
    await expect.poll(() => page.locator('.rl-file-ok').textContent()).toContain('Restored the autosaved tuning');
  });

  it('writes a screenshot of the scene with the panel to test-artifacts/editor.png', async () => {
    await page.locator('#panel .tp-tbiv', { hasText: 'vehicles' }).click();
    await page.keyboard.down('Space');
    await page.waitForTimeout(1200);
    mkdirSync(join(repo, 'test-artifacts'), { recursive: true });
    const png = await page.screenshot({ path: join(repo, 'test-artifacts', 'editor.png') });
    await page.keyboard.up('Space');
    // PNG signature (ISO/IEC 15948 §5.2) and a 1280×720 IHDR.
    expect([...png.subarray(0, 8)]).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
    expect(png.readUInt32BE(16)).toBe(1280);
    expect(png.readUInt32BE(20)).toBe(720);
    expect(consoleErrors).toEqual([]);
  });
});
