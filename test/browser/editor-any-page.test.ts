// The editor on a page that is not the sample scene: the built `ralenti/editor` entry mounted with one call.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { build } from 'esbuild';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
// @ts-expect-error: plain ESM script without declarations
import { buildDist } from '../../scripts/build.mjs';
import { browserSuiteMode, openPage, type BrowserSession } from './browser-harness';

const mode = browserSuiteMode();
if (mode === 'skip') console.warn('editor-on-any-page suite skipped: /usr/bin/chromium is absent and CI is not set');

describe.skipIf(mode === 'skip')('the editor entry on a game page of its own', () => {
  let session: BrowserSession | null = null;
  const dist = mkdtempSync(join(tmpdir(), 'ralenti-editor-dist-'));

  beforeAll(async () => {
    if (mode === 'fail') throw new Error('CI is set but /usr/bin/chromium is missing; .ci/run installs it with apt-get install -y chromium');
    await buildDist({ outdir: dist, declarations: false, log: () => undefined });
    // The page imports the package's built entries, as a game's bundler would resolve `ralenti/…`.
    const page = await build({
      entryPoints: [join(process.cwd(), 'test/browser/game-page.ts')], bundle: true, format: 'esm', platform: 'browser', target: 'es2022',
      write: false, outfile: 'page.js', logLevel: 'error', nodePaths: [join(process.cwd(), 'node_modules')],
      plugins: [{
        name: 'built-entries',
        setup(b) {
          b.onResolve({ filter: /^\.\.\/\.\.\/(runtime|editor)\/index$/ }, (a) => ({ path: join(dist, `${a.path.includes('editor') ? 'editor' : 'runtime'}.js`) }));
        },
      }],
    });
    session = await openPage({
      '/index.html': '<!doctype html><meta charset="utf-8"><title>a game</title><button id="play">Play</button><script type="module" src="/page.js"></script>',
      '/page.js': page.outputFiles[0].text,
      '/ralenti-processor.js': readFileSync(join(dist, 'ralenti-processor.js'), 'utf8'),
    });
    await session.page.click('#play');
    await session.page.waitForFunction(() => window.game.ready || window.game.error !== null, null, { timeout: 20_000 });
  }, 120_000);

  afterAll(async () => {
    await session?.close();
    rmSync(dist, { recursive: true, force: true });
  });

  it('mounts the panel in a dock with the same sections and names the readouts after the game’s source', async () => {
    const page = session!.page;
    expect(await page.evaluate(() => window.game.error)).toBeNull();
    const titles = await page.locator('.rl-dock .tp-fldv_t').allTextContents();
    for (const s of ['Time flow', 'Sound groups', 'Doppler & air', 'Distance & glides', 'Live readouts', 'A/B compare', 'Tuning file', 'Listening']) expect(titles).toContain(s);
    await expect.poll(() => page.locator('.rl-voices td', { hasText: 'mine cart' }).count(), { timeout: 8000 }).toBeGreaterThan(0);
    // The dock leaves its width to the page as a CSS variable.
    const width = await page.evaluate(() => getComputedStyle(document.documentElement).getPropertyValue('--rl-dock-width'));
    expect(width).toMatch(/^\d+px$/);
  });

  it('applies an edit to the game’s running tuning and takes it back with Ctrl+Z', async () => {
    const page = session!.page;
    const factor = () => page.evaluate(() => JSON.parse(window.game.tuningJson()).doppler.factor as number);
    await page.locator('.rl-dock .tp-fldv_t', { hasText: 'Doppler & air' }).click();
    const input = page.locator('[data-field="doppler.factor"] input').last();
    await input.fill('2.5');
    await input.press('Enter');
    await expect.poll(factor).toBe(2.5);
    await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
    await page.keyboard.press('Control+z');
    await expect.poll(factor).toBe(1);
  });

  it('resizes the dock by dragging its left edge and folds it to a strip and back', async () => {
    const page = session!.page;
    const width = () => page.evaluate(() => document.querySelector<HTMLElement>('.rl-dock')!.getBoundingClientRect().width);
    const published = () => page.evaluate(() => getComputedStyle(document.documentElement).getPropertyValue('--rl-dock-width'));
    const grip = (await page.locator('.rl-dock-grip').boundingBox())!;
    await page.mouse.move(grip.x + grip.width / 2, 300);
    await page.mouse.down();
    await page.mouse.move(grip.x - 100, 300, { steps: 4 });
    await page.mouse.up();
    const wide = await width();
    expect(wide).toBeGreaterThan(390);
    expect(await published()).toBe(`${Math.round(wide)}px`);
    await page.locator('.rl-dock-fold').click();
    expect(await width()).toBe(30);
    expect(await published()).toBe('30px');
    await page.locator('.rl-dock-fold').click();
    expect(await width()).toBe(wide);
  });
});
