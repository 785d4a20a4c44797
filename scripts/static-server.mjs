// A small static file server for the build folder: 127.0.0.1 only, no path outside the root, no foreign Host.
// Each file is opened once (never following a link in its last component), the opened descriptor is checked
// against the real path inside the root (same device and inode), and the body is read from that descriptor,
// so a link swapped in between the check and the read cannot serve a file from elsewhere.
import { createServer } from 'node:http';
import { constants } from 'node:fs';
import { open, realpath, stat } from 'node:fs/promises';
import { extname, resolve, sep } from 'node:path';

/** Largest file served, bytes (the build's biggest asset is a few MB). */
export const MAX_SERVED_BYTES = 256 * 1024 * 1024;

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
 * Whether a request's Host header names the bound loopback address and port exactly (no other name: a page
 * on another origin reaching us through DNS rebinding sends its own host name).
 */
export function hostAllowed(host, port) {
  if (typeof host !== 'string') return false;
  const h = host.trim().toLowerCase();
  return h === `127.0.0.1:${port}`;
}

/**
 * Opens `file` for reading without following a link in its last component, and returns the open handle only when
 * it is a regular file whose real path lies inside `realRoot` and is the very file opened (same device and inode);
 * null otherwise (the handle is then closed).
 */
export async function openInside(realRoot, file) {
  const flags = constants.O_RDONLY | (constants.O_NOFOLLOW ?? 0) | (constants.O_NONBLOCK ?? 0);
  let handle;
  try {
    handle = await open(file, flags);
  } catch {
    return null;
  }
  try {
    const info = await handle.stat();
    if (!info.isFile() || info.size > MAX_SERVED_BYTES) throw new Error('not a servable file');
    const real = await realpath(file);
    if (!real.startsWith(realRoot + sep)) throw new Error('outside the root');
    const named = await stat(real);
    if (named.dev !== info.dev || named.ino !== info.ino) throw new Error('changed while opening');
    return { handle, size: info.size };
  } catch {
    await handle.close().catch(() => {});
    return null;
  }
}

/**
 * Starts serving `root` on 127.0.0.1. Tries `port` and, unless `strictPort`, the next ports up to
 * 20 above it; port 0 asks the system for a free one. Resolves to { server, port, url, close() }.
 */
export async function serveStatic({ root, port = 5173, strictPort = false, log = () => {} }) {
  let boundPort = -1;
  let realRoot = null;
  const server = createServer(async (req, res) => {
    if (!hostAllowed(req.headers.host, boundPort)) {
      log(`refused Host ${JSON.stringify(req.headers.host)}`);
      return send(res, 421, 'wrong host: use the 127.0.0.1 URL the server printed');
    }
    const file = req.method === 'GET' || req.method === 'HEAD' ? resolveRequestPath(root, req.url) : undefined;
    if (file === undefined) return send(res, 405, 'method not allowed');
    if (file === null) {
      log(`refused ${req.url}`);
      return send(res, 400, 'bad path');
    }
    realRoot ??= await realpath(root).catch(() => null);
    const opened = realRoot === null ? null : await openInside(realRoot, file);
    if (opened === null) return send(res, 404, 'not found');
    try {
      const body = Buffer.alloc(opened.size);
      let got = 0;
      while (got < body.length) {
        const { bytesRead } = await opened.handle.read(body, got, body.length - got, got);
        if (bytesRead === 0) break;
        got += bytesRead;
      }
      res.writeHead(200, {
        'content-type': contentTypes[extname(file)] ?? 'application/octet-stream',
        'content-length': got,
        'cache-control': 'no-store',
      });
      res.end(req.method === 'HEAD' ? undefined : body.subarray(0, got));
    } catch {
      send(res, 404, 'not found');
    } finally {
      await opened.handle.close().catch(() => {});
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
  boundPort = actual;
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
