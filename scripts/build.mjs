// `npm run build` (and `npm pack`, through prepack): ESM bundles of the core, the analysis helpers and the runtime
// into dist/, the worklet as its own file, an entry with the worklet inlined (Blob URL), the `ralenti` program
// (dist/cli/), .d.ts declarations from tsc with explicit `.js` extensions (for NodeNext), and each entry's size.
import * as esbuild from 'esbuild';
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { gzipSync } from 'node:zlib';
import { buildWorklet, workletSourceText } from './build-worklet.mjs';
import { buildWasm } from './build-wasm.mjs';
import { buildCli } from './build-cli.mjs';

const repo = resolve(dirname(fileURLToPath(import.meta.url)), '..');

/** Entry points of dist/ (name → source); the declarations sit under dist/types/ at the same relative path. */
export const distEntries = Object.freeze({
  index: 'src/index.ts',
  analysis: 'src/analysis/index.ts',
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

/** Path of TypeScript's `tsc` program, found by module resolution (works with dependencies hoisted to a workspace). */
function tscProgram() {
  const require = createRequire(import.meta.url);
  return join(dirname(require.resolve('typescript/package.json')), 'bin', 'tsc');
}

/**
 * Rewrites extension-less relative specifiers of the emitted declarations ('./x' → './x.js', './dir' → './dir/index.js')
 * so that `moduleResolution: node16/nodenext` resolves them (TypeScript handbook, "Modules — Reference": relative
 * imports in ES modules need the extension; docs/references.md §15g); resolves to the number of specifiers changed.
 */
export function addDeclarationExtensions(typesDir) {
  let changed = 0;
  const walk = (dir) => {
    for (const f of readdirSync(dir, { withFileTypes: true })) {
      const path = join(dir, f.name);
      if (f.isDirectory()) walk(path);
      else if (f.name.endsWith('.d.ts')) {
        const text = readFileSync(path, 'utf8');
        const next = text.replace(/(\bfrom\s*|\bimport\s*\(\s*|\bimport\s+)(['"])(\.\.?(?:\/[^'"]*)?)\2/g, (m, lead, q, spec) => {
          if (/\.(js|mjs|cjs|json)$/.test(spec)) return m;
          const target = resolve(dirname(path), spec);
          const file = existsSync(`${target}.d.ts`) ? `${spec}.js` : existsSync(join(target, 'index.d.ts')) ? `${spec.replace(/\/$/, '')}/index.js` : null;
          if (file === null) return m;
          changed += 1;
          return `${lead}${q}${file}${q}`;
        });
        if (next !== text) writeFileSync(path, next);
      }
    }
  };
  walk(typesDir);
  return changed;
}

/**
 * Size of each entry as a game's bundler would ship it: the entry and every chunk it imports, bundled and minified
 * by esbuild (packages such as three stay external), then gzipped at level 9. Resolves to rows
 * { entry, minifiedBytes, gzipBytes }.
 */
export async function entrySizes(outdir) {
  const rows = [];
  const files = { ...Object.fromEntries(Object.keys(distEntries).map((k) => [k, `${k}.js`])), 'ralenti-processor': 'ralenti-processor.js' };
  for (const [entry, file] of Object.entries(files)) {
    const r = await esbuild.build({
      entryPoints: [join(outdir, file)], bundle: true, minify: true, write: false, format: 'esm',
      platform: 'neutral', packages: 'external', logLevel: 'error', legalComments: 'none',
    });
    const code = r.outputFiles[0].contents;
    rows.push({ entry, minifiedBytes: code.length, gzipBytes: gzipSync(code, { level: 9 }).length });
  }
  return rows;
}

/** The size rows as a Markdown table (KiB = 1024 bytes). */
export function sizeTable(rows) {
  const kib = (n) => (n / 1024).toFixed(1);
  return ['| entry | minified KiB | minified + gzip KiB |', '| --- | --- | --- |',
    ...rows.map((r) => `| ${r.entry} | ${kib(r.minifiedBytes)} | ${kib(r.gzipBytes)} |`)].join('\n');
}

/** Builds dist/ under `outdir` (default <repo>/dist); resolves to the list of written files. */
export async function buildDist({ outdir = join(repo, 'dist'), declarations = true, cli = false, sizes = false, log = console.log } = {}) {
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
  const files = [workletFile, ...Object.keys(result.metafile.outputs).map((f) => resolve(process.cwd(), f))];
  if (declarations) {
    const tsc = spawnSync(process.execPath, [tscProgram(), '-p', join(repo, 'tsconfig.build.json'), '--outDir', join(outdir, 'types')], {
      cwd: repo, stdio: 'inherit',
    });
    if (tsc.status !== 0) throw new Error('declaration emit failed (tsc -p tsconfig.build.json)');
    addDeclarationExtensions(join(outdir, 'types'));
  }
  if (cli) files.push(await buildCli({ outfile: join(outdir, 'cli', 'ralenti.mjs') }));
  writeFileSync(join(outdir, 'README.txt'), [
    'Ralenti build output (npm run build).',
    'index.js: core; analysis.js: pitch tracking and spectrum (needs fft.js); runtime.js: createRalenti (worklet URL: ralenti-processor.js beside this file, or options.workletUrl);',
    'runtime-inline.js: the same with the worklet embedded as a Blob URL; three.js, howler.js: adapters;',
    'editor.js: the tuning editor (mountEditor) for development builds; needs tweakpane;',
    'types/: declarations mirroring the source tree.',
    '',
  ].join('\n'));
  log(`dist: ${files.filter((f) => f.endsWith('.js')).length} JS files in ${relative(process.cwd(), outdir) || '.'}`);
  if (sizes) log(`\nentry sizes (what a game ships when it imports the entry):\n${sizeTable(await entrySizes(outdir))}`);
  return files;
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  await buildDist({ cli: true, sizes: true });
}
