// A small static file server for the build folder: 127.0.0.1 only, no path outside the root.
import { createServer } from 'node:http';
import { readFile, realpath, stat } from 'node:fs/promises';
import { extname, resolve, sep } from 'node:path';

/** Content types of the files the build writes. */
const contentTypes = Object.freeze({
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.map': 'application/json; charset=utf-8',
  '.png': 'image/png',
  '.svg': 'image/svg+xml',
  '.wav': 'audio/wav',
});

/**
 * Maps a raw request target to a file path inside root, or returns null when the target is refused:
 * parent segments ("..", plain or percent-encoded, even double-encoded), backslashes, NUL bytes,
 * absolute-form or authority-form targets, drive letters and "//" prefixes are all refused.
 */
export function resolveRequestPath(root, rawUrl) {
  if (typeof rawUrl !== 'string' || !rawUrl.startsWith('/') || rawUrl.startsWith('//')) return null;
  let path = rawUrl.split(/[?#]/, 1)[0];
  // Decode repeatedly so that "%252e%252e" cannot smuggle a ".." past one decoding step.
  for (let i = 0; i < 4; i++) {
    let next;
    try {
      next = decodeURIComponent(path);
    } catch {
      return null;
    }
    if (next === path) break;
    path = next;
    if (i === 3) return null;
  }
  if (path.includes('\0') || path.includes('\\') || path.startsWith('//')) return null;
  const segments = path.split('/');
  if (segments.some((s) => s === '..' || s === '.' || /^[A-Za-z]:$/.test(s))) return null;
  if (path.endsWith('/')) path += 'index.html';
  const base = resolve(root);
  const full = resolve(base, '.' + path);
  if (full !== base && !full.startsWith(base + sep)) return null;
  return full;
}

/**
 * Starts serving `root` on 127.0.0.1. Tries `port` and, unless `strictPort`, the next ports up to
 * 20 above it; port 0 asks the system for a free one. Resolves to { server, port, url, close() }.
 */
export async function serveStatic({ root, port = 5173, strictPort = false, log = () => {} }) {
  const server = createServer(async (req, res) => {
    const file = req.method === 'GET' || req.method === 'HEAD' ? resolveRequestPath(root, req.url) : undefined;
    if (file === undefined) return send(res, 405, 'method not allowed');
    if (file === null) {
      log(`refused ${req.url}`);
      return send(res, 400, 'bad path');
    }
    try {
      const info = await stat(file);
      if (!info.isFile()) return send(res, 404, 'not found');
      // A symbolic link inside the folder may point out of it: serve only files whose real path is inside.
      const realRoot = await realpath(root);
      const real = await realpath(file);
      if (!real.startsWith(realRoot + sep)) return send(res, 404, 'not found');
      const body = await readFile(file);
      res.writeHead(200, {
        'content-type': contentTypes[extname(file)] ?? 'application/octet-stream',
        'content-length': body.length,
        'cache-control': 'no-store',
      });
      res.end(req.method === 'HEAD' ? undefined : body);
    } catch {
      send(res, 404, 'not found');
    }
  });
  const last = port === 0 || strictPort ? port : port + 20;
  for (let p = port; p <= last; p++) {
    const ok = await new Promise((done, fail) => {
      const onError = (err) => {
        server.off('listening', onListening);
        if (err.code === 'EADDRINUSE' && p < last) done(false);
        else fail(err);
      };
      const onListening = () => {
        server.off('error', onError);
        done(true);
      };
      server.once('error', onError);
      server.once('listening', onListening);
      server.listen(p, '127.0.0.1');
    });
    if (ok) break;
  }
  const actual = server.address().port;
  return {
    server,
    port: actual,
    url: `http://127.0.0.1:${actual}/`,
    close: () => new Promise((done) => server.close(() => done())),
  };
}

function send(res, status, text) {
  res.writeHead(status, { 'content-type': 'text/plain; charset=utf-8' });
  res.end(text + '\n');
}
