// `npm run soak`: renders 30 minutes of simulated gameplay offline through the engine (bench/soak-session.ts) and
// prints heap at start and end, non-finite samples, clamps and the real-time factor. Options: --seconds N, --seed N.
import { build } from 'esbuild';
import { mkdtempSync, rmSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';

function option(name, fallback) {
  const i = process.argv.indexOf(`--${name}`);
  if (i < 0) return fallback;
  const n = Number(process.argv[i + 1]);
  if (!Number.isFinite(n) || n <= 0) throw new Error(`--${name} expects a positive number, got ${process.argv[i + 1]}`);
  return n;
}

const seconds = option('seconds', 1800);
const seed = option('seed', 0x50a4);
setFlagsFromString('--expose-gc');
const gc = globalThis.gc ?? runInNewContext('gc');
// Bundled under node_modules/ so that package imports resolve from the project, like the bench driver.
const out = mkdtempSync(join(resolve('node_modules'), '.ralenti-soak-'));
try {
  const outfile = join(out, 'soak.mjs');
  await build({ entryPoints: [resolve('bench/soak-session.ts')], outfile, bundle: true, platform: 'node', format: 'esm', target: 'node20', packages: 'external', logLevel: 'error' });
  const { runSoak, formatSoak } = await import(pathToFileURL(outfile).href);
  console.log(`soak: ${seconds} s of simulated gameplay (seed ${seed}), rendered offline at 48 kHz`);
  const figures = runSoak({
    seconds,
    seed,
    gc,
    heapUsed: () => process.memoryUsage().heapUsed,
    now: () => performance.now(),
    progress: process.stderr.isTTY ? (f) => process.stderr.write(`  ${(100 * f).toFixed(0).padStart(3)} %\r`) : undefined,
  });
  if (process.stderr.isTTY) process.stderr.write('\n');
  console.log(formatSoak(figures));
  const ok = figures.nonFinite === 0 && figures.overCeiling === 0 && figures.errors === 0 && Math.abs(figures.heapChange) <= 0.05 && figures.realTimeFactor > 1;
  console.log(ok ? 'soak: PASS (finite, under the ceiling, heap within 5 %, faster than real time)' : 'soak: FAIL');
  process.exitCode = ok ? 0 : 1;
} finally {
  rmSync(out, { recursive: true, force: true });
}
