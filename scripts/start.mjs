// `npm start`: builds the sample scene and worklet, serves build/ on 127.0.0.1, rebuilds on change.
// Options: --port N (default 5173, or the next free one), --no-watch, --outdir DIR (default build/).
import { resolve } from 'node:path';
import { buildScene, defaultOutdir } from './dev-build.mjs';
import { buildWasm } from './build-wasm.mjs';
import { serveStatic } from './static-server.mjs';

function parseArgs(argv) {
  const out = { port: 5173, strictPort: false, watch: true, outdir: defaultOutdir };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--port' || a.startsWith('--port=')) {
      const v = a.includes('=') ? a.slice(7) : argv[++i];
      const n = Number(v);
      if (!Number.isInteger(n) || n < 0 || n > 65535) throw new Error(`--port expects 0…65535, got ${v}`);
      out.port = n;
      out.strictPort = true;
    } else if (a === '--no-watch') out.watch = false;
    else if (a === '--outdir') out.outdir = resolve(argv[++i] ?? '');
    else throw new Error(`unknown option ${a} (options: --port N, --no-watch, --outdir DIR)`);
  }
  return out;
}

const args = parseArgs(process.argv.slice(2));
await buildWasm();
const build = await buildScene({ outdir: args.outdir, watch: args.watch });
const served = await serveStatic({ root: args.outdir, port: args.port, strictPort: args.strictPort });
console.log(`Ralenti sample scene: ${served.url}`);
console.log('Start at a low listening level; the master limiter is on by default. Ctrl+C stops.');

let stopping = false;
async function stop() {
  if (stopping) return;
  stopping = true;
  await build.dispose();
  await served.close();
  process.exit(0);
}
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
