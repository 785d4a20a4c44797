// Bundles the AudioWorklet processor (runtime/worklet/ralenti-processor.ts) with esbuild as one self-contained file.
import * as esbuild from 'esbuild';
import { existsSync } from 'node:fs';
import { mkdir } from 'node:fs/promises';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

// The repository root: beside this script, or the working directory when this file was bundled elsewhere (bench).
const here = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const repo = existsSync(join(here, 'runtime', 'worklet', 'ralenti-processor.ts')) ? here : process.cwd();

/** Entry file of the processor. */
export const workletEntry = join(repo, 'runtime', 'worklet', 'ralenti-processor.ts');

/** File name of the bundled processor inside an output folder. */
export const workletFileName = 'ralenti-processor.js';

function options(minify) {
  return {
    entryPoints: [workletEntry],
    bundle: true,
    format: 'esm',
    // AudioWorkletGlobalScope runs modern JavaScript; keep the output free of Node or DOM shims.
    platform: 'neutral',
    target: 'es2022',
    minify: Boolean(minify),
    legalComments: 'none',
    logLevel: 'error',
  };
}

/**
 * Writes <outdir>/ralenti-processor.js (and a source map unless minified); resolves to the file path.
 * @param {{ outdir: string, minify?: boolean }} opts
 */
export async function buildWorklet({ outdir, minify = false }) {
  await mkdir(outdir, { recursive: true });
  const outfile = join(outdir, workletFileName);
  await esbuild.build({ ...options(minify), outfile, sourcemap: minify ? false : 'linked' });
  return outfile;
}

/**
 * Bundles the processor in memory and resolves to its source text (for the inlined Blob-URL variant).
 * @param {{ minify?: boolean }} [opts]
 */
export async function workletSourceText({ minify = true } = {}) {
  const result = await esbuild.build({ ...options(minify), write: false, outfile: workletFileName });
  return result.outputFiles[0].text;
}
