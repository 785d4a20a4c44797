// `npm start` as a user meets it: bad options get the usage and exit 2, a busy port a one-line message and exit 1
// (before any build), and a watching start builds the scene once.
import { afterAll, describe, expect, it } from 'vitest';
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

const start = resolve(__dirname, '../../scripts/start.mjs');
const base = mkdtempSync(join(tmpdir(), 'ralenti-start-'));
afterAll(() => rmSync(base, { recursive: true, force: true }));

const runStart = (args: string[]) => spawnSync(process.execPath, [start, ...args], { encoding: 'utf8', timeout: 60_000 });

describe('npm start (scripts/start.mjs) command line', () => {
  it.each([['--bogus'], ['--port', 'abc'], ['--port', '70000'], ['--port']].map((a) => [a.join(' '), a]))('refuses `%s` with the usage and exit code 2, building nothing', (_text, args) => {
    const outdir = join(base, `bad-${args.join('')}`);
    const r = runStart([...args, '--outdir', outdir, '--no-watch']);
    expect(r.status).toBe(2);
    expect(r.stderr.split('\n')[0]).toMatch(/^npm start: /);
    expect(r.stderr).toContain('usage: npm start');
    expect(r.stderr).not.toMatch(/\n\s+at /); // no stack trace
    expect(existsSync(outdir)).toBe(false);
  });

  it('prints its usage for --help and its version for --version', () => {
    expect(runStart(['--help']).stdout).toContain('--port N');
    expect(runStart(['--version']).stdout.trim()).toMatch(/^\d+\.\d+\.\d+/);
  });

  it('reports a busy --port in one line and exits 1 before building', async () => {
    const blocker = createServer();
    await new Promise<void>((ok) => blocker.listen(0, '127.0.0.1', ok));
    const port = (blocker.address() as { port: number }).port;
    const outdir = join(base, 'busy');
    try {
      const r = runStart(['--port', String(port), '--outdir', outdir, '--no-watch']);
      expect(r.status).toBe(1);
      expect(r.stderr.trim().split('\n')).toEqual([expect.stringContaining(`port ${port} is in use`)]);
      expect(existsSync(join(outdir, 'app.js'))).toBe(false);
    } finally {
      blocker.close();
    }
  });

  it('builds the scene once when it starts watching', async () => {
    let child: ChildProcess | null = null;
    let out = '';
    try {
      child = spawn(process.execPath, [start, '--port', '0', '--outdir', join(base, 'watch')], { stdio: ['ignore', 'pipe', 'pipe'] });
      child.stdout!.on('data', (d) => (out += d.toString()));
      child.stderr!.on('data', (d) => (out += d.toString()));
      await new Promise<void>((done, fail) => {
        const timer = setInterval(() => {
          if (/Ctrl\+C/.test(out)) {
            clearInterval(timer);
            done();
          }
        }, 50);
        child!.on('exit', (code) => fail(new Error(`start.mjs exited with ${code}: ${out}`)));
      });
      // A second build would log "scene rebuilt" right after the first; give it the time one build takes.
      await new Promise((r) => setTimeout(r, 3000));
      expect(out).not.toContain('scene rebuilt');
      expect(out).toMatch(/http:\/\/127\.0\.0\.1:\d+\//);
    } finally {
      if (child?.pid !== undefined && child.exitCode === null) {
        const exited = new Promise((r) => child!.once('exit', r));
        child.kill('SIGTERM');
        await exited;
      }
    }
  }, 120_000);
});
