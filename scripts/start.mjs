// `npm start`: builds the sample scene and worklet, serves build/ on 127.0.0.1, rebuilds on change.
// Options: --port N (default 5173, or the next free one), --no-watch, --outdir DIR (default build/), --help.
// Exit codes: 0 stopped by Ctrl+C, 1 cannot serve or build, 2 bad arguments.
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { buildScene, defaultOutdir } from './dev-build.mjs';
import { buildWasm } from './build-wasm.mjs';
import { serveStatic } from './static-server.mjs';

const DEFAULT_PORT = 5173;
const usage = `usage: npm start -- [--port N] [--no-watch] [--outdir DIR]

  --port N        serve on port N (0…65535; 0 lets the system choose); without it, ${DEFAULT_PORT} or the next free port
  --no-watch      build once, do not rebuild on change
  --outdir DIR    build folder to write and serve (default build/)
  --help          this help
`;

/** A bad command line: a one-line message, the usage, exit code 2. */
class UsageError extends Error {}

function parseArgs(argv) {
  const out = { port: DEFAULT_PORT, strictPort: false, watch: true, outdir: defaultOutdir, help: false };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--port' || a.startsWith('--port=')) {
      const v = a.includes('=') ? a.slice('--port='.length) : argv[++i];
      const n = v === undefined || v.trim() === '' ? NaN : Number(v);
      if (!Number.isInteger(n) || n < 0 || n > 65535) throw new UsageError(`--port expects a whole number 0…65535, got ${v === undefined ? 'nothing' : JSON.stringify(v)}`);
      out.port = n;
      out.strictPort = true;
    } else if (a === '--no-watch') out.watch = false;
    else if (a === '--outdir' || a.startsWith('--outdir=')) {
      const v = a.includes('=') ? a.slice('--outdir='.length) : argv[++i];
      if (!v) throw new UsageError('--outdir expects a folder');
      out.outdir = resolve(v);
    } else if (a === '--help' || a === '-h') out.help = true;
    else if (a === '--version') out.version = true;
    else throw new UsageError(`unknown option ${JSON.stringify(a)}`);
  }
  return out;
}

let args;
try {
  args = parseArgs(process.argv.slice(2));
} catch (e) {
  if (!(e instanceof UsageError)) throw e;
  process.stderr.write(`npm start: ${e.message}\n\n${usage}`);
  process.exit(2);
}
if (args.help) {
  process.stdout.write(usage);
  process.exit(0);
}
if (args.version) {
  process.stdout.write(`${JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')).version}\n`);
  process.exit(0);
}

// Bind the port first, so that a busy port is reported at once rather than after the build.
let served;
try {
  served = await serveStatic({ root: args.outdir, port: args.port, strictPort: args.strictPort });
} catch (e) {
  if (e?.code !== 'EADDRINUSE' && e?.code !== 'EACCES') throw e;
  const which = args.strictPort ? `port ${args.port} is` : `ports ${args.port}…${args.port + 20} are`;
  const why = e.code === 'EACCES' ? `not allowed (port ${args.port})` : `${which} in use`;
  process.stderr.write(`npm start: cannot serve on 127.0.0.1: ${why}; pick another with --port N, or --port 0 for any free port\n`);
  process.exit(1);
}
if (!args.strictPort && served.port !== args.port) console.log(`port ${args.port} is in use; serving on ${served.port} instead`);

let build;
try {
  await buildWasm();
  build = await buildScene({ outdir: args.outdir, watch: args.watch });
} catch (e) {
  process.stderr.write(`npm start: build failed: ${e?.message ?? e}\n`);
  await served.close();
  process.exit(1);
}
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
