// Shared set-up of the browser suites that drive the sample scene: `npm start`'s own server on a free port, and a
// Chromium page on it that collects console errors.
import { spawn, type ChildProcess } from 'node:child_process';
import { join, resolve } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from './browser-harness';

const repo = resolve(__dirname, '../..');

/** Starts scripts/start.mjs on port 0 (the system picks a free one) and resolves with its printed URL. */
export function startSceneServer(outdir: string): Promise<{ child: ChildProcess; url: string }> {
  return new Promise((done, fail) => {
    const child = spawn(process.execPath, ['scripts/start.mjs', '--port', '0', '--no-watch', '--outdir', outdir], { cwd: repo, stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    const timer = setTimeout(() => fail(new Error(`server did not print its URL: ${out}`)), 60_000);
    child.stdout!.on('data', (d: Buffer) => {
      out += d.toString();
      const m = out.match(/http:\/\/127\.0\.0\.1:\d+\//);
      if (m) {
        clearTimeout(timer);
        done({ child, url: m[0] });
      }
    });
    child.stderr!.on('data', (d: Buffer) => (out += d.toString()));
    child.on('exit', (code) => fail(new Error(`server exited (${code}): ${out}`)));
  });
}

/** A served scene open in Chromium; `close` ends the browser and the server it started. */
export interface ScenePage {
  page: Page;
  context: BrowserContext;
  server: ChildProcess;
  url: string;
  /** Console errors and page errors seen so far. */
  consoleErrors: string[];
  close(): Promise<void>;
}

/** Builds and serves the scene into `work`/build, opens it in Chromium (profile in `work`) at the given viewport size. */
export async function openScenePage(work: string, viewport: { width: number; height: number }): Promise<ScenePage> {
  const started = await startSceneServer(join(work, 'build'));
  const context = await chromium.launchPersistentContext(join(work, 'profile'), {
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: [...CHROMIUM_ARGS, '--autoplay-policy=no-user-gesture-required'],
    viewport,
    acceptDownloads: true,
  });
  const page = context.pages()[0] ?? (await context.newPage());
  const consoleErrors: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') consoleErrors.push(m.text());
  });
  page.on('pageerror', (e) => consoleErrors.push(`pageerror: ${e.message}`));
  await page.goto(started.url);
  const server = started.child;
  return {
    page,
    context,
    server,
    url: started.url,
    consoleErrors,
    async close() {
      await context.close();
      if (server.pid) server.kill('SIGTERM');
    },
  };
}

/** Polls `read(page)` every `stepMs` until `test` holds; throws naming `what` and the last state after `timeoutMs`. */
export async function waitForState<H extends { tuningJson?: unknown }>(page: Page, read: (page: Page) => Promise<H>, what: string, test: (h: H) => boolean, timeoutMs: number, stepMs: number): Promise<H> {
  let last: H | null = null;
  for (let waited = 0; waited <= timeoutMs; waited += stepMs) {
    last = await read(page);
    if (test(last)) return last;
    await page.waitForTimeout(stepMs);
  }
  throw new Error(`timed out waiting for ${what}; last state: ${JSON.stringify({ ...last, tuningJson: undefined })}`);
}
