// The sample scene and tuning panel in real Chromium, served by `npm start`'s own server on a random free port:
// the panel's sections and readouts, curve edits, files, and a designer's whole session (edit, undo, compare, save,
// reload: nothing lost), with screenshots at three window sizes.
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
const SECTIONS = ['Time flow', 'Sound groups', 'Doppler & air', 'Distance & glides', 'Live readouts', 'A/B compare', 'Tuning file', 'Listening'];

interface Voice {
  name: string;
  ratioCents: number;
  dopplerCents: number;
}
interface EditorState { side: 'A' | 'B'; dirty: boolean; canUndo: boolean; canRedo: boolean; notice: string; autosave: string; autosavePending: boolean; savedText: string }
type Handle = { ready: boolean; error: string | null; timeScale: number; voices: Voice[]; tuningJson: string | null; editor: EditorState | null };

const handle = (page: Page) => page.evaluate(() => {
  const h = (window as unknown as { ralentiScene: Handle }).ralentiScene;
  return { ready: h.ready, error: h.error, timeScale: h.timeScale, voices: h.voices, tuningJson: h.tuningJson, editor: h.editor };
});

const waitFor = (page: Page, what: string, test: (h: Handle) => boolean, timeoutMs = 8000) => waitForState(page, handle, what, test, timeoutMs, 100);
const tuning = async (page: Page) => JSON.parse((await handle(page)).tuningJson!);

async function startAudio(page: Page): Promise<void> {
  await page.click('#start-button');
  const h = await waitFor(page, 'audio to start', (x) => x.ready || x.error !== null, 20_000);
  expect(h.error).toBeNull();
  await blur(page);
}

const blur = (page: Page) => page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
const voice = (h: Handle, name: string) => h.voices.find((v) => v.name === name);
const folder = (page: Page, title: string) => page.locator('#panel .tp-fldv', { has: page.locator(':scope > .tp-fldv_b .tp-fldv_t', { hasText: new RegExp(`^${title}$`) }) });
const field = (page: Page, path: string) => page.locator(`#panel [data-field="${path}"] input`).last();

async function open(page: Page, title: string): Promise<void> {
  const f = folder(page, title);
  if (!(await f.evaluate((e) => e.classList.contains('tp-fldv-expanded')))) await f.locator('.tp-fldv_t').first().click();
}

async function type(page: Page, path: string, text: string): Promise<void> {
  const input = field(page, path);
  await input.fill(text);
  await input.press('Enter');
  await blur(page);
}

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

  it('shows every panel section, and a tooltip with unit and range on every tuning field', async () => {
    const titles = await page.locator('#panel .tp-fldv_t').allTextContents();
    for (const s of SECTIONS) expect(titles).toContain(s);
    const tips = await page.locator('#panel [data-field]').evaluateAll((els) => els.map((e) => ({ path: (e as HTMLElement).dataset.field!, title: (e as HTMLElement).title })));
    expect(tips.length).toBeGreaterThanOrEqual(25);
    for (const t of tips) expect(t.title, t.path).toMatch(/Range -?[\d.]+…[\d.]+|One of: |On or off/);
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

  it('shows the master peak with a hold in dBFS', async () => {
    await expect.poll(() => page.locator('#panel [data-meter="master"] .rl-meter-text').textContent(), { timeout: 8000 }).toMatch(/^-\d+\.\d · hold -\d+\.\d dBFS$/);
  });

  it('moves the time scale to the slow-motion target while Space is held, and back to 1 on release', async () => {
    const target = (await tuning(page)).timeFlow.slowMotionScale as number;
    await page.keyboard.down('Space');
    await waitFor(page, `time scale ${target}`, (x) => Math.abs(x.timeScale - target) < 0.005);
    await page.keyboard.up('Space');
    await waitFor(page, 'time scale 1', (x) => Math.abs(x.timeScale - 1) < 0.005);
  });

  it('changes the voice targets when a pitch-curve key is edited', async () => {
    // The generator (ambience group, stationary, no Doppler) plays at 0 cents at time scale 1.
    await waitFor(page, 'generator at 0 cents', (x) => Math.abs(voice(x, 'generator')?.ratioCents ?? 99) < 1);
    await page.locator('#panel .rl-group-tab', { hasText: 'ambience' }).click();
    const blade = page.locator('[data-curve="ambience · speed & pitch ×"]');
    await blade.locator('circle[data-x="1"]').click();
    await blade.locator('input[aria-label^="value of the selected key"]').fill('0.5');
    await blade.locator('input[aria-label^="value of the selected key"]').press('Enter');
    // Pitch curve value 0.5 at time scale 1 halves the playback ratio: −1200 cents (an octave).
    const h = await waitFor(page, 'generator near −1200 cents', (x) => Math.abs((voice(x, 'generator')?.ratioCents ?? 0) + 1200) < 5);
    const keys = JSON.parse(h.tuningJson!).groups.ambience.pitch.keys as { x: number; y: number }[];
    expect(keys.find((k) => k.x === 1)?.y).toBe(0.5);
    await blur(page);
  });

  it('moves a curve key dragged with the mouse and stores it rounded to the curve’s steps on release', async () => {
    await page.locator('#panel .rl-group-tab', { hasText: 'ambience' }).click();
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
    // Level keys step by 0.1 dB and x by 0.001.
    expect(Number(after[1].y.toFixed(1))).toBe(after[1].y);
    expect(Number(after[1].x.toFixed(3))).toBe(after[1].x);
  });

  it('stores typed numbers rounded to the field’s step, reverts text that is not a number, and announces clamps', async () => {
    await open(page, 'Time flow');
    await type(page, 'timeFlow.slowMotionScale', '0.1');
    await expect.poll(async () => (await tuning(page)).timeFlow.slowMotionScale).toBe(0.1);
    await type(page, 'timeFlow.slowMotionScale', 'abc');
    expect(await field(page, 'timeFlow.slowMotionScale').inputValue()).toBe('0.10');
    await expect.poll(async () => (await handle(page)).editor!.notice).toContain('"abc" is not a number; kept 0.10');
    await type(page, 'timeFlow.rampInSeconds', '12');
    await expect.poll(async () => (await tuning(page)).timeFlow.rampInSeconds).toBe(10);
    expect((await handle(page)).editor!.notice).toContain('12 is outside 0…10 s; set to 10.00');
  });

  it('uses and clears a speed-of-sound override, and the readout shows the speed in use', async () => {
    await open(page, 'Doppler & air');
    const readout = page.locator('#panel .tp-lblv', { has: page.locator('.tp-lblv_l', { hasText: /^sound \(m\/s\)$/ }) }).locator('input');
    await expect.poll(() => readout.inputValue()).toBe('343.2'); // 331.3·√(1 + 20/273.15) at 20 °C (docs/references.md §2)
    const overrideBox = folder(page, 'Doppler & air').locator('.tp-lblv', { has: page.locator('.tp-lblv_l', { hasText: /^override sound$/ }) }).locator('.tp-ckbv_w');
    await overrideBox.click();
    await type(page, 'air.speedOfSound', '300');
    await expect.poll(async () => (await tuning(page)).air.speedOfSound).toBe(300);
    await expect.poll(() => readout.inputValue()).toBe('300.0');
    await overrideBox.click();
    await blur(page);
    await expect.poll(async () => (await tuning(page)).air.speedOfSound).toBeNull();
    await expect.poll(() => readout.inputValue()).toBe('343.2');
  });

  it('undoes and redoes with the keys and the buttons, keeping the selected group, open folders and scroll', async () => {
    await page.locator('#panel .rl-group-tab', { hasText: 'ambience' }).click();
    const scroller = page.locator('#panel .rl-dock-body');
    await scroller.evaluate((e) => (e.scrollTop = 300));
    const before = (await tuning(page)).air.speedOfSound;
    expect(before).toBeNull();
    await page.keyboard.press('Control+z');
    await expect.poll(async () => (await tuning(page)).air.speedOfSound).toBe(300);
    expect(await page.locator('#panel .rl-group-tab[aria-selected="true"]').textContent()).toBe('ambience');
    expect(await folder(page, 'Doppler & air').evaluate((e) => e.classList.contains('tp-fldv-expanded'))).toBe(true);
    expect(Math.abs((await scroller.evaluate((e) => e.scrollTop)) - 300)).toBeLessThan(2);
    await page.keyboard.press('Control+Shift+z');
    await expect.poll(async () => (await tuning(page)).air.speedOfSound).toBeNull();
    await page.locator('#panel button', { hasText: /^Undo$/ }).click();
    await expect.poll(async () => (await tuning(page)).air.speedOfSound).toBe(300);
    await page.locator('#panel button', { hasText: /^Redo$/ }).click();
    await expect.poll(async () => (await tuning(page)).air.speedOfSound).toBeNull();
  });

  it('switches between the saved tuning (A) and the edits (B) with the ` key and lists their differences by JSON path', async () => {
    const edited = (await handle(page)).tuningJson!;
    const saved = (await handle(page)).editor!.savedText;
    expect(edited).not.toBe(saved);
    await page.keyboard.press('`');
    await waitFor(page, 'tuning A', (x) => x.editor!.side === 'A' && x.tuningJson === saved);
    await page.keyboard.press('`');
    await waitFor(page, 'tuning B', (x) => x.editor!.side === 'B' && x.tuningJson === edited);
    const paths = await page.locator('#panel .rl-diff code').allTextContents();
    expect(paths).toEqual(expect.arrayContaining(['timeFlow.slowMotionScale', 'timeFlow.rampInSeconds', 'groups.ambience.pitch.keys[3].y']));
  });

  it('asks before a reset replaces unsaved edits; declining keeps them, accepting resets and undo brings them back', async () => {
    const edited = (await handle(page)).tuningJson!;
    page.once('dialog', (d) => void d.dismiss());
    await page.locator('#panel button', { hasText: 'Reset to built-in' }).click();
    await page.waitForTimeout(200);
    expect((await handle(page)).tuningJson).toBe(edited);
    page.once('dialog', (d) => void d.accept());
    await page.locator('#panel button', { hasText: 'Reset to built-in' }).click();
    await waitFor(page, 'the built-in tuning', (x) => x.tuningJson !== edited && JSON.parse(x.tuningJson!).timeFlow.slowMotionScale === 0.35);
    await page.keyboard.press('Control+z');
    await waitFor(page, 'the edits back', (x) => x.tuningJson === edited);
  });

  it('saves (a download here: the file was not opened through the File System Access API) and is then not dirty', async () => {
    const edited = (await handle(page)).tuningJson!;
    const [download] = await Promise.all([page.waitForEvent('download'), page.locator('#panel button', { hasText: /^Save tuning/ }).click()]);
    const file = join(work, 'saved.json');
    await download.saveAs(file);
    expect(readFileSync(file, 'utf8')).toBe(edited);
    await waitFor(page, 'saved', (x) => x.editor!.dirty === false);
  });

  it('loads a file (undo takes the load back) and shows a malformed file’s problems by JSON path, keeping the running tuning', async () => {
    const before = (await handle(page)).tuningJson!;
    const other = JSON.parse(before);
    other.doppler.factor = 2;
    await page.setInputFiles('#ralenti-tuning-file', { name: 'other.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(other)) });
    await waitFor(page, 'the loaded tuning', (x) => JSON.parse(x.tuningJson!).doppler.factor === 2);
    await expect.poll(() => page.locator('.rl-file-ok').textContent()).toContain('other.json: loaded');
    await page.keyboard.press('Control+z');
    await waitFor(page, 'the load undone', (x) => x.tuningJson === before);
    const bad = JSON.parse(before);
    bad.doppler.factor = 'loud';
    bad.groups.ambience.pitch.keys[0].x = 3;
    await page.setInputFiles('#ralenti-tuning-file', { name: 'bad.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(bad)) });
    await expect.poll(() => page.locator('.rl-file-bad').textContent()).toContain('bad.json: not loaded');
    const paths = await page.locator('.rl-file-problems code').allTextContents();
    expect(paths).toContain('doppler.factor');
    expect(paths.some((p) => p.startsWith('groups.ambience.pitch.keys'))).toBe(true);
    expect((await handle(page)).tuningJson).toBe(before);
  });

  it('replaces a source’s sound with a WAV dropped on its label, decoded at the file’s own rate and named in the readouts', async () => {
    // 0.5 s of a 220 Hz sine at 22050 Hz, 16-bit PCM (RIFF WAVE layout: docs/references.md §17).
    const wav = await page.evaluate(() => {
      const rate = 22050;
      const n = rate / 2;
      const b = new DataView(new ArrayBuffer(44 + 2 * n));
      const s = (o: number, t: string) => [...t].forEach((c, i) => b.setUint8(o + i, c.charCodeAt(0)));
      s(0, 'RIFF'); b.setUint32(4, 36 + 2 * n, true); s(8, 'WAVE'); s(12, 'fmt '); b.setUint32(16, 16, true);
      b.setUint16(20, 1, true); b.setUint16(22, 1, true); b.setUint32(24, rate, true); b.setUint32(28, 2 * rate, true);
      b.setUint16(32, 2, true); b.setUint16(34, 16, true); s(36, 'data'); b.setUint32(40, 2 * n, true);
      for (let i = 0; i < n; i++) b.setInt16(44 + 2 * i, Math.round(8000 * Math.sin((2 * Math.PI * 220 * i) / rate)), true);
      return [...new Uint8Array(b.buffer)];
    });
    const label = page.locator('.range-label', { hasText: 'Hum generator' });
    const box = (await label.boundingBox())!;
    await page.evaluate(({ bytes, x, y }) => {
      const dt = new DataTransfer();
      dt.items.add(new File([new Uint8Array(bytes)], 'hum.wav', { type: 'audio/wav' }));
      const target = document.getElementById('range')!;
      target.dispatchEvent(new DragEvent('dragover', { dataTransfer: dt, clientX: x, clientY: y, bubbles: true, cancelable: true }));
      target.dispatchEvent(new DragEvent('drop', { dataTransfer: dt, clientX: x, clientY: y, bubbles: true, cancelable: true }));
    }, { bytes: wav, x: box.x + box.width / 2, y: box.y + box.height / 2 });
    await expect.poll(async () => (await handle(page)).editor!.notice, { timeout: 8000 }).toBe('generator · hum.wav: now plays hum.wav (decoded at its own 22050 Hz).');
    await expect.poll(() => page.locator('.rl-voices td', { hasText: 'generator · hum.wav' }).count(), { timeout: 8000 }).toBe(1);
    expect(await label.textContent()).toContain('hum.wav');
  });

  it('restores the edits after a reload: only a tuning that ran is autosaved, and nothing is lost', async () => {
    await waitFor(page, 'the autosave', (x) => x.editor!.autosavePending === false);
    const before = (await handle(page)).tuningJson!;
    expect(JSON.parse(before).groups.ambience.pitch.keys.find((k: { x: number }) => k.x === 1).y).toBe(0.5);
    await page.reload();
    await startAudio(page);
    const h = await waitFor(page, 'the restored tuning', (x) => x.tuningJson !== null);
    expect(h.tuningJson).toBe(before);
    await expect.poll(() => page.locator('.rl-file-ok').textContent()).toContain('Restored the autosaved tuning');
  });

  it('keeps the group tabs on one row past six groups (four groups added to the built-in ones)', async () => {
    const t = await tuning(page);
    const before = Object.keys(t.groups).length;
    for (const g of ['weapons', 'voices', 'footsteps', 'doors']) t.groups[g] = t.groups.effects;
    page.once('dialog', (d) => void d.accept());
    await page.setInputFiles('#ralenti-tuning-file', { name: 'more-groups.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(t)) });
    await expect.poll(() => page.locator('#panel .rl-group-tab').count()).toBe(before + 4);
    const tops = await page.locator('#panel .rl-group-tab').evaluateAll((els) => els.map((e) => (e as HTMLElement).offsetTop));
    expect(new Set(tops).size).toBe(1);
    await page.locator('#panel .rl-group-tab', { hasText: 'doors' }).click();
    expect(await page.locator('#panel .rl-group-tab[aria-selected="true"]').textContent()).toBe('doors');
    await page.keyboard.press('Control+z');
    await expect.poll(() => page.locator('#panel .rl-group-tab').count()).toBe(before);
  });

  it.each([
    [1024, 768],
    [1920, 1080],
    [2560, 1440],
  ])('lays out the scene and panel at %i×%i (labels clear of each other and of the panel) and writes a screenshot', async (width, height) => {
    await page.setViewportSize({ width, height });
    const tab = page.locator('#panel .rl-group-tab', { hasText: 'vehicles' });
    if ((await tab.getAttribute('aria-selected')) !== 'true') await tab.click();
    await blur(page);
    await page.keyboard.down('Space');
    await page.waitForTimeout(900);
    const layout = await page.evaluate(() => {
      const panel = document.getElementById('panel')!.getBoundingClientRect();
      const labels = [...document.querySelectorAll<HTMLElement>('.range-label')].filter((e) => e.style.display !== 'none').map((e) => e.getBoundingClientRect());
      return { panelLeft: panel.left, panelWidth: panel.width, labels: labels.map((r) => ({ l: r.left, r: r.right, t: r.top, b: r.bottom })) };
    });
    expect(layout.panelWidth).toBeGreaterThanOrEqual(280);
    for (const [i, a] of layout.labels.entries()) {
      expect(a.r, `label ${i} under the panel`).toBeLessThanOrEqual(layout.panelLeft + 0.5);
      for (const b of layout.labels.slice(i + 1)) expect(a.l < b.r && a.r > b.l && a.t < b.b && a.b > b.t, `labels overlap: ${JSON.stringify([a, b])}`).toBe(false);
    }
    mkdirSync(join(repo, 'test-artifacts'), { recursive: true });
    const png = await page.screenshot({ path: join(repo, 'test-artifacts', `editor-${width}x${height}.png`) });
    await page.keyboard.up('Space');
    // PNG signature (ISO/IEC 15948 §5.2) and the IHDR size.
    expect([...png.subarray(0, 8)]).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
    expect([png.readUInt32BE(16), png.readUInt32BE(20)]).toEqual([width, height]);
    expect(consoleErrors).toEqual([]);
  });
});
