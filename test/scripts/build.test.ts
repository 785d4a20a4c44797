import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
// @ts-expect-error: plain ESM script without declarations
import { buildDist } from '../../scripts/build.mjs';

describe('npm run build (scripts/build.mjs)', () => {
  const out = mkdtempSync(join(tmpdir(), 'ralenti-dist-'));
  beforeAll(async () => {
    // Another build's output (the CLI under dist/cli) must survive; a stale root file must not.
    mkdirSync(join(out, 'cli'));
    writeFileSync(join(out, 'cli', 'ralenti.mjs'), '// cli');
    writeFileSync(join(out, 'chunk-STALE.js'), '// old chunk');
    await buildDist({ outdir: out, log: () => undefined });
  }, 120_000);
  afterAll(() => rmSync(out, { recursive: true, force: true }));

  it('writes the ESM entries, the worklet as its own file, and declarations for core and runtime', () => {
    for (const f of ['index.js', 'analysis.js', 'runtime.js', 'runtime-inline.js', 'three.js', 'howler.js', 'editor.js', 'ralenti-processor.js']) {
      expect(existsSync(join(out, f)), f).toBe(true);
    }
    for (const f of ['src/index.d.ts', 'runtime/index.d.ts', 'runtime/inline.d.ts', 'runtime/three/index.d.ts', 'runtime/howler/index.d.ts', 'editor/index.d.ts']) {
      expect(existsSync(join(out, 'types', f)), f).toBe(true);
    }
    expect(readFileSync(join(out, 'types/runtime/index.d.ts'), 'utf8')).toContain('createRalenti');
  });

  it('replaces its own earlier outputs and leaves other folders of dist/ alone', () => {
    expect(existsSync(join(out, 'cli', 'ralenti.mjs'))).toBe(true);
    expect(existsSync(join(out, 'chunk-STALE.js'))).toBe(false);
  });

  it('bundles the worklet self-contained (no imports) and registers the processor', () => {
    const w = readFileSync(join(out, 'ralenti-processor.js'), 'utf8');
    expect(w).toContain('registerProcessor(');
    expect(w).not.toMatch(/^\s*import\s/m);
  });

  it('embeds the processor source only in the inlined entry', () => {
    const inline = readFileSync(join(out, 'runtime-inline.js'), 'utf8');
    expect(inline).toContain('registerProcessor(');
    const others = readdirSync(out).filter((f) => f.endsWith('.js') && f !== 'runtime-inline.js' && f !== 'ralenti-processor.js');
    expect(others).toEqual(expect.arrayContaining(['index.js', 'runtime.js', 'three.js', 'howler.js'])); // the loop has files to check
    for (const f of others) expect(readFileSync(join(out, f), 'utf8'), f).not.toContain('registerProcessor(');
  });

  it('keeps the chunk holding the default worklet URL beside ralenti-processor.js', () => {
    const holder = readdirSync(out).filter((f) => f.endsWith('.js') && readFileSync(join(out, f), 'utf8').includes('"./ralenti-processor.js"'));
    expect(holder.length).toBeGreaterThan(0);
  });

  it('points every package.json export at a file the build writes (types first), all inside the published files', () => {
    const pkg = JSON.parse(readFileSync(join(__dirname, '../..', 'package.json'), 'utf8'));
    const targets: string[] = [];
    for (const [name, target] of Object.entries<string | Record<string, string>>(pkg.exports)) {
      if (typeof target === 'string') {
        targets.push(target);
        continue;
      }
      // TypeScript reads the first matching condition: "types" must come before "default" (TypeScript handbook, package.json "exports").
      expect(Object.keys(target), name).toEqual(['types', 'default']);
      expect(target.types, name).toMatch(/\.d\.ts$/);
      targets.push(target.types, target.default);
    }
    expect(pkg.exports['.'].default).toBe('./dist/index.js');
    for (const t of targets) {
      expect(t.endsWith('.ts') && !t.endsWith('.d.ts'), `${t}: a TypeScript source file`).toBe(false);
      const path = t.startsWith('./dist/') ? join(out, t.slice('./dist/'.length)) : join(__dirname, '../..', t);
      expect(existsSync(path), t).toBe(true);
      if (t === './package.json') continue; // npm always packs the manifest
      expect(pkg.files.some((f: string) => t.slice(2) === f || t.slice(2).startsWith(`${f}/`)), `${t} in "files"`).toBe(true);
    }
    expect(pkg.files).toContain('dist');
    expect(pkg.scripts.prepack).toMatch(/scripts\/build\.mjs/);
  });

  it('builds the editor entry importing only tweakpane beyond the package itself (its core is bundled in)', () => {
    expect(readFileSync(join(out, 'types/editor/index.d.ts'), 'utf8')).toContain('mountEditor');
    const bare = new Set<string>();
    const files = readdirSync(out).filter((f) => f.endsWith('.js') && f !== 'ralenti-processor.js');
    // esbuild writes module-level imports at line starts: `import … from "x";` (possibly over several lines) or `import "x";`.
    for (const f of files) for (const m of readFileSync(join(out, f), 'utf8').matchAll(/^import\s(?:[^;"]*?\sfrom\s*)?"([^"]+)"/gm)) if (!m[1].startsWith('.')) bare.add(`${f}:${m[1]}`);
    const fromEditor = [...bare].filter((b) => b.startsWith('editor.js:')).map((b) => b.slice('editor.js:'.length));
    expect(fromEditor).toEqual(['tweakpane']);
    expect([...bare].some((b) => b.endsWith(':@tweakpane/core'))).toBe(false);
  });

  it('has no install-time script in the manifest (npm runs these in every game that installs the package)', () => {
    const pkg = JSON.parse(readFileSync(join(__dirname, '../..', 'package.json'), 'utf8'));
    // npm docs, "scripts" (Life Cycle Scripts): preinstall, install, postinstall and prepare run on install (docs/references.md §15f).
    for (const s of ['preinstall', 'install', 'postinstall', 'prepare']) expect(pkg.scripts?.[s], s).toBeUndefined();
  });

  it('lists as dependencies exactly the bare packages the published bundles import, and nothing else', () => {
    const pkg = JSON.parse(readFileSync(join(__dirname, '../..', 'package.json'), 'utf8'));
    const imported = new Set<string>();
    for (const f of readdirSync(out).filter((n) => n.endsWith('.js'))) {
      for (const m of readFileSync(join(out, f), 'utf8').matchAll(/\bfrom\s*["']([^"'.][^"']*)["']|\bimport\s*\(\s*["']([^"'.][^"']*)["']/g)) {
        imported.add((m[1] ?? m[2]).split('/').slice(0, (m[1] ?? m[2]).startsWith('@') ? 2 : 1).join('/'));
      }
    }
    // Optional peers (tweakpane, imported by the development-only editor entry) are the game's own and not dependencies.
    const peers = [...imported].filter((p) => pkg.peerDependenciesMeta?.[p]?.optional === true);
    expect([...imported].filter((p) => !peers.includes(p)).sort()).toEqual(Object.keys(pkg.dependencies ?? {}).sort());
    expect(peers).toEqual(['tweakpane']);
    // three, howler and tweakpane are the game's own copies: optional peers, never hard dependencies.
    for (const p of ['three', 'howler', 'tweakpane']) {
      expect(pkg.dependencies?.[p], p).toBeUndefined();
      expect(pkg.peerDependenciesMeta?.[p]?.optional, p).toBe(true);
    }
  });

  it('writes declarations whose relative imports name a .js file that exists beside them (NodeNext resolution)', () => {
    const bad: string[] = [];
    let checked = 0;
    const walk = (dir: string) => {
      for (const f of readdirSync(dir, { withFileTypes: true })) {
        const path = join(dir, f.name);
        if (f.isDirectory()) walk(path);
        else if (f.name.endsWith('.d.ts')) {
          for (const m of readFileSync(path, 'utf8').matchAll(/(?:\bfrom\s*|\bimport\s*\(\s*)["'](\.[^"']*)["']/g)) {
            checked += 1;
            const spec = m[1];
            if (!spec.endsWith('.js') || !existsSync(join(dir, spec.replace(/\.js$/, '.d.ts')))) bad.push(`${path}: ${spec}`);
          }
        }
      }
    };
    walk(join(out, 'types'));
    expect(checked).toBeGreaterThan(50);
    expect(bad).toEqual([]);
  });

  it('loads the core bundle as plain ESM in Node', async () => {
    const core = await import(pathToFileURL(join(out, 'index.js')).href);
    expect(typeof core.parseTuning).toBe('function');
    expect(core.qualityTiers).toEqual(['draft', 'standard', 'high']);
  });
});
