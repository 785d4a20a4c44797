// `npm run build`: ESM bundles of the core and the runtime into dist/, the worklet as its own file, an entry with
// the worklet inlined (Blob URL), and .d.ts declarations from tsc (TypeScript 7 emits declarations).
import * as esbuild from 'esbuild';
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildWorklet, workletSourceText } from './build-worklet.mjs';
import { buildWasm } from './build-wasm.mjs';

const repo = resolve(dirname(fileURLToPath(import.meta.url)), '..');

/** Entry points of dist/ (name → source); the declarations sit under dist/types/ at the same relative path. */
export const distEntries = Object.freeze({
  index: 'src/index.ts',
  runtime: 'runtime/index.ts',
  'runtime-inline': 'runtime/inline.ts',
  three: 'runtime/three/index.ts',
  howler: 'runtime/howler/index.ts',
  // The tuning editor for development builds (ralenti/editor): tweakpane stays the page's; @tweakpane/core is bundled.
  editor: 'editor/index.ts',
});

/** Packages left to the user's bundler (every package but @tweakpane/core, as before the editor entry existed). */
export const externalPackages = Object.freeze(['three', 'three/*', 'howler', 'tweakpane', 'fft.js', 'node:*']);

/** Removes what an earlier build wrote (root files and types/), leaving other folders such as dist/cli/ alone. */
function cleanOwnOutputs(outdir) {
  if (!existsSync(outdir)) return;
  for (const f of readdirSync(outdir, { withFileTypes: true })) {
    if (f.isFile() && /\.(js|map|txt)$/.test(f.name)) rmSync(join(outdir, f.name), { force: true });
  }
  rmSync(join(outdir, 'types'), { recursive: true, force: true });
}

/** Builds dist/ under `outdir` (default <repo>/dist); resolves to the list of written files. */
export async function buildDist({ outdir = join(repo, 'dist'), declarations = true, log = console.log } = {}) {
  await buildWasm({ log });
  cleanOwnOutputs(outdir);
  const workletFile = await buildWorklet({ outdir, minify: false });
  const inlined = await workletSourceText({ minify: true });
  const entryPoints = Object.fromEntries(Object.entries(distEntries).map(([k, v]) => [k, join(repo, v)]));
  const result = await esbuild.build({
    entryPoints,
    outdir,
    bundle: true,
    splitting: true,
    format: 'esm',
    platform: 'neutral',
    target: 'es2022',
    // three, howler and tweakpane stay the game's own copies; @tweakpane/core (a build-time dependency of the
    // editor's curve blade) is bundled, so that the editor needs nothing beyond tweakpane.
    external: [...externalPackages],
    mainFields: ['module', 'main'],
    sourcemap: 'linked',
    // Chunks beside the entries: defaultWorkletUrl() resolves './ralenti-processor.js' against its chunk's URL.
    chunkNames: '[name]-[hash]',
    define: { __RALENTI_WORKLET_SOURCE__: JSON.stringify(inlined) },
    metafile: true,
    logLevel: 'error',
  });
  const files = [workletFile, ...Object.keys(result.metafile.outputs).map((f) => resolve(repo, f))];
  if (declarations) {
    const tsc = spawnSync('npx', ['tsc', '-p', join(repo, 'tsconfig.build.json'), '--outDir', join(outdir, 'types')], {
      cwd: repo, stdio: 'inherit',
    });
    if (tsc.status !== 0) throw new Error('declaration emit failed (tsc -p tsconfig.build.json)');
  }
  writeFileSync(join(outdir, 'README.txt'), [
    'Ralenti build output (npm run build).',
    'index.js: core; runtime.js: createRalenti (worklet URL: ralenti-processor.js beside this file, or options.workletUrl);',
    'runtime-inline.js: the same with the worklet embedded as a Blob URL; three.js, howler.js: adapters;',
    'editor.js: the tuning editor (mountEditor) for development builds; needs tweakpane;',
    'types/: declarations mirroring the source tree.',
    '',
  ].join('\n'));
  log(`dist: ${files.filter((f) => f.endsWith('.js')).length} JS files, worklet ${inlined.length} bytes minified`);
  return files;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  await buildDist();
}
