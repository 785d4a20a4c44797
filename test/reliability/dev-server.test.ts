// The development server binds 127.0.0.1 only and serves only its build folder. Real HTTP requests (raw request
// lines, so no client normalises them) try plain, percent-encoded, double- and triple-encoded traversal, backslashes,
// absolute and authority forms, and a symbolic link out of the folder; none reaches a file outside it.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, mkdirSync, writeFileSync, rmSync, symlinkSync } from 'node:fs';
import { tmpdir, networkInterfaces } from 'node:os';
import { join, resolve } from 'node:path';
import { connect } from 'node:net';
import { spawn, type ChildProcess } from 'node:child_process';
// @ts-expect-error plain ES module without type declarations
import { serveStatic } from '../../scripts/static-server.mjs';

const SECRET = 'outside-the-build-folder-7f3a';
const base = mkdtempSync(join(tmpdir(), 'ralenti-reliability-serve-'));
const root = join(base, 'build');
mkdirSync(join(root, 'assets'), { recursive: true });
writeFileSync(join(root, 'index.html'), '<p>scene</p>');
writeFileSync(join(root, 'assets', 'app.js'), 'export {};');
writeFileSync(join(base, 'secret.txt'), SECRET);
symlinkSync(join(base, 'secret.txt'), join(root, 'assets', 'linked.txt'));
symlinkSync(base, join(root, 'up'));

/** One raw HTTP/1.1 request; resolves to status and body. */
function raw(port: number, target: string, method = 'GET', host = '127.0.0.1'): Promise<{ status: number; body: string }> {
  return new Promise((done, fail) => {
    const socket = connect(port, host, () => socket.write(`${method} ${target} HTTP/1.1\r\nHost: 127.0.0.1:${port}\r\nConnection: close\r\n\r\n`));
    let text = '';
    socket.setTimeout(10_000, () => socket.destroy(new Error('timeout')));
    socket.on('data', (d) => (text += d.toString('latin1')));
    socket.on('end', () => done({ status: Number(text.split(' ')[1]), body: text.slice(text.indexOf('\r\n\r\n') + 4) }));
    socket.on('error', fail);
  });
}

/** Whether a TCP connection to host:port is accepted. */
function accepts(port: number, host: string): Promise<boolean> {
  return new Promise((done) => {
    const socket = connect({ port, host, timeout: 2000 }, () => {
      socket.destroy();
      done(true);
    });
    socket.on('error', () => done(false));
    socket.on('timeout', () => {
      socket.destroy();
      done(false);
    });
  });
}

/** Traversal attempts that must be refused outright (400). */
const refused = [
  '/../secret.txt',
  '/assets/../../secret.txt',
  '/%2e%2e/secret.txt',
  '/%2E%2E/secret.txt',
  '/.%2e/secret.txt',
  '/%2e./secret.txt',
  '/..%2fsecret.txt',
  '/%2e%2e%2fsecret.txt',
  '/assets/%2e%2e%2f%2e%2e%2fsecret.txt',
  '/%252e%252e/secret.txt',
  '/%252e%252e%252fsecret.txt',
  '/%25252e%25252e/secret.txt',
  '/..%5csecret.txt',
  '/%2e%2e%5csecret.txt',
  '/assets\\..\\..\\secret.txt',
  '/%c0%ae%c0%ae/secret.txt',
  '//etc/passwd',
  '//' + base.slice(1) + '/secret.txt',
  'http://127.0.0.1/../secret.txt',
  'secret.txt',
  '*',
  '/C:/Windows/win.ini',
  '/index.html%00.txt',
];
/** Absolute file-system paths asked for as URL paths: looked up inside the folder, so not found. */
const notFound = ['/etc/passwd', base + '/secret.txt', '/proc/self/environ', '/assets/linked.txt', '/up/secret.txt'];

describe('static server of the build folder', () => {
  let served: { port: number; url: string; server: { address(): { address: string } }; close: () => Promise<void> };
  beforeAll(async () => {
    served = await serveStatic({ root, port: 0 });
  });
  afterAll(async () => {
    await served.close();
  });

  it('listens on 127.0.0.1 only: not on ::1, not on the machine\'s other addresses', async () => {
    expect(served.server.address().address).toBe('127.0.0.1');
    expect(await accepts(served.port, '127.0.0.1')).toBe(true);
    expect(await accepts(served.port, '::1')).toBe(false);
    const others = Object.values(networkInterfaces()).flat().filter((a) => a && !a.internal && a.family === 'IPv4');
    for (const a of others) expect(await accepts(served.port, a!.address), a!.address).toBe(false);
  });

  it('serves files of the folder', async () => {
    expect(await raw(served.port, '/')).toEqual({ status: 200, body: '<p>scene</p>' });
    expect((await raw(served.port, '/assets/app.js?v=1#x')).status).toBe(200);
  });

  it.each(refused)('refuses %s with 400 and never shows the outside file', async (target) => {
    const r = await raw(served.port, target);
    expect(r.status).toBe(400);
    expect(r.body).not.toContain(SECRET);
  });

  it.each(notFound)('answers %s with 404 (looked up inside the folder, links out of it not followed)', async (target) => {
    const r = await raw(served.port, target);
    expect(r.status).toBe(404);
    expect(r.body).not.toContain(SECRET);
    expect(r.body).not.toMatch(/root:|PATH=/);
  });

  it('refuses methods other than GET and HEAD', async () => {
    expect((await raw(served.port, '/', 'POST')).status).toBe(405);
    expect((await raw(served.port, '/', 'PUT')).status).toBe(405);
  });
});

describe('npm start (scripts/start.mjs)', () => {
  let child: ChildProcess | null = null;
  const outdir = join(base, 'start-build');
  afterAll(async () => {
    if (child?.pid !== undefined && child.exitCode === null) {
      const exited = new Promise((r) => child!.once('exit', r));
      child.kill('SIGTERM');
      await exited;
    }
    rmSync(base, { recursive: true, force: true });
  });

  it('builds, prints a 127.0.0.1 URL, refuses traversal over the wire, and stops on SIGTERM', async () => {
    child = spawn(process.execPath, [resolve('scripts/start.mjs'), '--port', '0', '--no-watch', '--outdir', outdir], { stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    const url = await new Promise<string>((done, fail) => {
      const timer = setTimeout(() => fail(new Error(`no URL printed: ${out}`)), 90_000);
      child!.stdout!.on('data', (d) => {
        out += d.toString();
        const m = /http:\/\/127\.0\.0\.1:(\d+)\//.exec(out);
        if (m && /Ctrl\+C/.test(out)) {
          clearTimeout(timer);
          done(m[0]);
        }
      });
      child!.stderr!.on('data', (d) => (out += d.toString()));
      child!.on('exit', (code) => fail(new Error(`start.mjs exited with ${code}: ${out}`)));
    });
    const port = Number(new URL(url).port);
    expect(out).toMatch(/low listening level/);
    expect((await raw(port, '/')).status).toBe(200);
    for (const target of ['/../secret.txt', '/%2e%2e/secret.txt', '/%252e%252e/secret.txt', '/..%2fsecret.txt', '//etc/passwd']) {
      const r = await raw(port, target);
      expect(r.status, target).toBe(400);
      expect(r.body).not.toContain(SECRET);
    }
    expect((await raw(port, '/etc/passwd')).status).toBe(404);
    expect(await accepts(port, '::1')).toBe(false);
    const exited = new Promise<number | null>((r) => child!.once('exit', (code) => r(code)));
    child.kill('SIGTERM');
    expect(await exited).toBe(0);
  }, 120_000);
});
