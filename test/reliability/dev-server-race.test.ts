// The development server opens each file once and serves from that descriptor, and answers only requests whose Host
// is the bound 127.0.0.1 address and port. A symbolic link swapped 400 times between a file (or folder) inside the
// build folder and one outside it, while the same path is requested, never serves the outside file.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, mkdirSync, writeFileSync, rmSync, symlinkSync, renameSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { connect } from 'node:net';
import { spawn } from 'node:child_process';
// @ts-expect-error plain ES module without type declarations
import { serveStatic, hostAllowed } from '../../scripts/static-server.mjs';

const SECRET = 'outside-the-build-folder-race-51c2';
const base = mkdtempSync(join(tmpdir(), 'ralenti-serve-race-'));
const root = join(base, 'build');
const outside = join(base, 'outside');
mkdirSync(join(root, 'real'), { recursive: true });
mkdirSync(outside);
writeFileSync(join(root, 'index.html'), '<p>scene</p>');
writeFileSync(join(root, 'inside.txt'), 'inside');
writeFileSync(join(root, 'real', 'data.txt'), 'inside');
writeFileSync(join(outside, 'data.txt'), SECRET);
writeFileSync(join(base, 'secret.txt'), SECRET);

/** One raw HTTP/1.1 request with the given Host header (null: none). */
function raw(port: number, target: string, host: string | null): Promise<{ status: number; body: string }> {
  return new Promise((done, fail) => {
    const socket = connect(port, '127.0.0.1', () =>
      socket.write(`GET ${target} HTTP/1.1\r\n${host === null ? '' : `Host: ${host}\r\n`}Connection: close\r\n\r\n`),
    );
    let text = '';
    socket.setTimeout(10_000, () => socket.destroy(new Error('timeout')));
    socket.on('data', (d) => (text += d.toString('latin1')));
    socket.on('end', () => done({ status: Number(text.split(' ')[1]), body: text.slice(text.indexOf('\r\n\r\n') + 4) }));
    socket.on('error', fail);
  });
}

/** Child-process script: swaps argv[1] between argv[2] and argv[3] 400 times, sleeping ~1 ms between swaps. */
const SWAPPER = `
const { symlinkSync, renameSync, rmSync } = require('node:fs');
const [link, inside, out] = process.argv.slice(1);
const nap = new Int32Array(new SharedArrayBuffer(4));
for (let i = 0; i < 400; i++) {
  const tmp = link + '.tmp';
  rmSync(tmp, { force: true });
  symlinkSync(i % 2 === 0 ? out : inside, tmp);
  renameSync(tmp, link);
  Atomics.wait(nap, 0, 0, 1);
}
`;

/** Points `link` at `target` atomically (a new link renamed over the old one). */
function swap(link: string, target: string): void {
  const tmp = `${link}.tmp`;
  rmSync(tmp, { force: true });
  symlinkSync(target, tmp);
  renameSync(tmp, link);
}

describe('dev server against link swaps and foreign hosts', () => {
  let served: { port: number; close: () => Promise<void> };
  beforeAll(async () => {
    served = await serveStatic({ root, port: 0 });
  });
  afterAll(async () => {
    await served.close();
    rmSync(base, { recursive: true, force: true });
  });

  it.each([
    ['evil.example:PORT', 421],
    ['localhost.evil.example', 421],
    ['127.0.0.1', 421],
    ['127.0.0.1:1', 421],
    ['[::1]:PORT', 421],
    ['', 421],
    [null, 400],
    ['127.0.0.1:PORT', 200],
  ] as const)('answers Host %s with %i', async (host, status) => {
    const h = host === null ? null : host.replace('PORT', String(served.port));
    const r = await raw(served.port, '/', h);
    // Node answers a request without Host itself (400, HTTP/1.1 requires one); either way nothing is served.
    expect(r.status).toBe(status);
    if (status !== 200) expect(r.body).not.toContain('scene');
  });

  it('accepts exactly the bound address and port in the Host header', () => {
    expect(hostAllowed('127.0.0.1:5173', 5173)).toBe(true);
    expect(hostAllowed(' 127.0.0.1:5173 ', 5173)).toBe(true);
    expect(hostAllowed('127.0.0.1:5174', 5173)).toBe(false);
    expect(hostAllowed('attacker.example:5173', 5173)).toBe(false);
    expect(hostAllowed(undefined, 5173)).toBe(false);
  });

  it.each([
    ['a file link', 'swap.txt', join(root, 'inside.txt'), join(base, 'secret.txt')],
    ['a folder link', 'dir/data.txt', join(root, 'real'), outside],
  ])('never serves the outside file while %s is swapped 400 times', async (what, target, inside, out) => {
    const link = join(root, target.split('/')[0]);
    swap(link, inside);
    // Another process swaps the link 400 times (about 1 ms apart) while this one keeps 8 requests in flight.
    const swapper = spawn(process.execPath, ['-e', SWAPPER, link, inside, out], { stdio: ['ignore', 'pipe', 'inherit'] });
    let finished = false;
    const exited = new Promise<number | null>((r) => swapper.once('exit', (code) => ((finished = true), r(code))));
    let leaks = 0;
    let requests = 0;
    const counts = new Map<number, number>();
    const one = async (): Promise<void> => {
      while (!finished) {
        const r = await raw(served.port, `/${target}`, `127.0.0.1:${served.port}`);
        requests++;
        if (r.body.includes(SECRET)) leaks++;
        counts.set(r.status, (counts.get(r.status) ?? 0) + 1);
      }
    };
    await Promise.all(Array.from({ length: 8 }, one));
    expect(await exited).toBe(0);
    console.log(`[race] ${what}: 400 swaps, ${requests} requests, ${leaks} leaks, statuses ${JSON.stringify([...counts])}`);
    expect(requests).toBeGreaterThan(50);
    expect(leaks).toBe(0);
  }, 60_000);
});
