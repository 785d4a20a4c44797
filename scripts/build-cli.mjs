// Bundles the command-line tool (runtime/cli/ralenti-main.ts) into one Node ESM file, dist/cli/ralenti.mjs by default.
import { build } from 'esbuild';
import { chmodSync } from 'node:fs';
import { resolve, dirname } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');

/** Builds the CLI bundle to `outfile` (absolute or relative to the repo root); resolves to the path written. */
export async function buildCli({ outfile = 'dist/cli/ralenti.mjs', minify = false } = {}) {
  const out = resolve(root, outfile);
  await build({
    entryPoints: [resolve(root, 'runtime/cli/ralenti-main.ts')],
    outfile: out,
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    minify,
    banner: { js: '#!/usr/bin/env node' },
    logLevel: 'error',
  });
  chmodSync(out, 0o755);
  return out;
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const out = await buildCli();
  console.log(`built ${out}`);
}
