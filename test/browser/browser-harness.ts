// Browser suite plumbing: finds Chromium, bundles the page and the worklet, serves them from memory on
// 127.0.0.1 (random free port), and launches Chromium through playwright-core with the house flags.
import { build } from 'esbuild';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

/** Debian's Chromium, installed by .ci/run. */
export const CHROMIUM_PATH = '/usr/bin/chromium';
/** Flags from the house rules. */
export const CHROMIUM_ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-quic', '--no-first-run', '--disable-component-update', '--disable-sync'];

/** 'run' when Chromium is present; 'skip' without it outside CI; 'fail' without it under CI. */
export function browserSuiteMode(path: string = CHROMIUM_PATH, env: Record<string, string | undefined> = process.env): 'run' | 'skip' | 'fail' {
  if (existsSync(path)) return 'run';
  return env.CI ? 'fail' : 'skip';
}

// npm scripts and vitest run from the repository root (this file is also bundled by the bench driver).
const repo = process.cwd();

/** Bundles a browser entry (ESM) in memory; `define` as esbuild's. */
export async function bundleForBrowser(entry: string, define: Record<string, string> = {}): Promise<string> {
  const r = await build({
    entryPoints: [resolve(repo, entry)], bundle: true, format: 'esm', platform: 'browser', target: 'es2022',
    write: false, outfile: 'out.js', define, logLevel: 'error',
  });
  return r.outputFiles[0].text;
}

/** A running page plus everything to close. */
export interface BrowserSession {
  page: Page;
  url: string;
  close(): Promise<void>;
}

/** Serves `files` (path → JavaScript or HTML text) on 127.0.0.1 and opens `/index.html` in a fresh Chromium profile. */
export async function openPage(files: Record<string, string>): Promise<BrowserSession> {
  const server: Server = createServer((req, res) => {
    const body = files[(req.url ?? '/').split('?')[0]];
    if (body === undefined) {
      res.writeHead(404).end();
      return;
    }
    const type = req.url?.endsWith('.html') ? 'text/html' : 'text/javascript';
    res.writeHead(200, { 'content-type': `${type}; charset=utf-8`, 'cache-control': 'no-store' }).end(body);
  });
  await new Promise<void>((ok) => server.listen(0, '127.0.0.1', ok));
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : 0;
  const url = `http://127.0.0.1:${port}`;
  const profile = mkdtempSync(join(tmpdir(), 'ralenti-chromium-'));
  let context: BrowserContext | null = null;
  try {
    context = await chromium.launchPersistentContext(profile, { executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS });
    const page = context.pages()[0] ?? (await context.newPage());
    await page.goto(`${url}/index.html`);
    return {
      page,
      url,
      close: async () => {
        await context?.close();
        await new Promise<void>((ok) => server.close(() => ok()));
        rmSync(profile, { recursive: true, force: true });
      },
    };
  } catch (err) {
    await context?.close();
    server.close();
    rmSync(profile, { recursive: true, force: true });
    throw err;
  }
}
