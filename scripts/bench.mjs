// Benchmark driver: bundles each bench/*.bench.ts with esbuild and runs its exported `run`.
// `npm run bench` prints tables; `npm run bench -- --json` prints one JSON object; other words filter by file name.
import { build } from 'esbuild';
import { readdirSync, mkdtempSync, rmSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { buildWasm } from './build-wasm.mjs';

const args = process.argv.slice(2);
const json = args.includes('--json');
const filters = args.filter((a) => !a.startsWith('--'));
const benchDir = resolve('bench');
const files = readdirSync(benchDir)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => filters.length === 0 || filters.some((w) => f.includes(w)))
  .sort();
// Bundles go under node_modules/ so that their external package imports resolve from the project.
const out = mkdtempSync(join(resolve('node_modules'), '.ralenti-bench-'));
const results = {};
await buildWasm({ log: json ? () => {} : console.log });
try {
  for (const file of files) {
    const name = file.replace(/\.bench\.ts$/, '');
    const outfile = join(out, `${name}.mjs`);
    await build({
      entryPoints: [join(benchDir, file)],
      outfile,
      bundle: true,
      platform: 'node',
      format: 'esm',
      target: 'node20',
      packages: 'external',
      logLevel: 'error',
    });
    const mod = await import(pathToFileURL(outfile).href);
    if (!json) console.log(`\n## ${name}\n`);
    results[name] = await mod.run({ json });
  }
} finally {
  rmSync(out, { recursive: true, force: true });
}
if (json) console.log(JSON.stringify(results, null, 2));
