// The dev server serves only its build folder: traversal, encoded traversal and absolute targets are refused.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, mkdirSync, writeFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { connect } from 'node:net';
// @ts-expect-error plain ES module without type declarations
import { resolveRequestPath, serveStatic } from '../../scripts/static-server.mjs';

const base = mkdtempSync(join(tmpdir(), 'ralenti-serve-'));
const root = join(base, 'build');
mkdirSync(join(root, 'sub'), { recursive: true });
writeFileSync(join(root, 'index.html'), '<p>index</p>');
writeFileSync(join(root, 'sub', 'a.js'), 'export {};');
writeFileSync(join(base, 'secret.txt'), 'outside the root');

/** Sends one raw request line (no client-side normalisation) and returns the status code. */
function rawStatus(port: number, target: string): Promise<number> {
  return new Promise((done, fail) => {
    const socket = connect(port, '127.0.0.1', () => {
      socket.write(`GET ${target} HTTP/1.1\r\nHost: 127.0.0.1:${port}\r\nConnection: close\r\n\r\n`);
    });
    let text = '';
    socket.on('data', (d) => (text += d.toString('latin1')));
    socket.on('end', () => done(Number(text.split(' ')[1])));
    socket.on('error', fail);
  });
}

describe('resolveRequestPath', () => {
  const refused = [
    '/../secret.txt',
    '/sub/../../secret.txt',
    '/%2e%2e/secret.txt',
    '/%2E%2E%2Fsecret.txt',
    '/sub/%2e%2e%2f%2e%2e%2fsecret.txt',
    '/%252e%252e/secret.txt',
    '/..%5csecret.txt',
    '//etc/passwd',
    'http://127.0.0.1/../secret.txt',
    '/C:/Windows/win.ini',
    '/index.html%00.js',
    '/%E0%A4%A',
  ];
  it.each(refused)('refuses %s', (target) => {
    expect(resolveRequestPath(root, target)).toBeNull();
  });

  it('maps "/" to index.html and nested paths inside the root', () => {
    expect(resolveRequestPath(root, '/')).toBe(join(root, 'index.html'));
    expect(resolveRequestPath(root, '/sub/a.js?x=1')).toBe(join(root, 'sub', 'a.js'));
  });
});

describe('serveStatic', () => {
  let served: { port: number; url: string; close: () => Promise<void> };
  beforeAll(async () => {
    served = await serveStatic({ root, port: 0 });
  });
  afterAll(async () => {
    await served.close();
    rmSync(base, { recursive: true, force: true });
  });

  it('listens on 127.0.0.1 and serves files of the root with their content type', async () => {
    expect(served.url).toBe(`http://127.0.0.1:${served.port}/`);
    const res = await fetch(served.url + 'sub/a.js');
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/javascript/);
    expect(await res.text()).toBe('export {};');
  });

  it.each([
    ['/../secret.txt', 400],
    ['/%2e%2e/secret.txt', 400],
    ['//etc/passwd', 400],
    ['/missing.js', 404],
  ])('answers %s with %i over the wire', async (target, status) => {
    expect(await rawStatus(served.port, target)).toBe(status);
  });

  it('moves to the next port when the asked one is taken', async () => {
    const second = await serveStatic({ root, port: served.port });
    try {
      expect(second.port).toBeGreaterThan(served.port);
    } finally {
      await second.close();
    }
  });
});
