// Reads the import graph and fails on a wrong-way import (DEVELOPERS.md: imports point one way).
import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, resolve, dirname } from 'node:path';

const root = resolve(__dirname, '..');
const layers = ['src', 'runtime', 'editor', 'sample-scene'] as const;
const rank: Record<string, number> = { src: 0, runtime: 1, editor: 2, 'sample-scene': 3 };

function walk(dir: string): string[] {
  let out: string[] = [];
  let entries: string[] = [];
  try {
    entries = readdirSync(dir);
  } catch {
    return out;
  }
  for (const e of entries) {
    const p = join(dir, e);
    if (statSync(p).isDirectory()) out = out.concat(walk(p));
    else if (/\.(ts|mts|js|mjs)$/.test(e)) out.push(p);
  }
  return out;
}

function importsOf(text: string): string[] {
  const specs: string[] = [];
  const re = /(?:import|export)\s[^'"]*?from\s*['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)|import\s*['"]([^'"]+)['"]/g;
  for (const m of text.matchAll(re)) specs.push(m[1] ?? m[2] ?? m[3]);
  return specs;
}

function layerOf(file: string): string | undefined {
  const top = relative(root, file).split(/[\\/]/)[0];
  return layers.includes(top as (typeof layers)[number]) ? top : undefined;
}

describe('import direction', () => {
  it('never imports upward (sample-scene → editor → runtime → src)', () => {
    const wrong: string[] = [];
    for (const layer of layers) {
      const files = walk(join(root, layer));
      expect(files.length, `${layer}/ has source files to check`).toBeGreaterThan(0); // walk() returns [] for a missing folder
      for (const file of files) {
        for (const spec of importsOf(readFileSync(file, 'utf8'))) {
          if (!spec.startsWith('.')) continue;
          const target = layerOf(resolve(dirname(file), spec));
          if (target && rank[target] > rank[layer]) wrong.push(`${relative(root, file)} → ${spec}`);
        }
      }
    }
    expect(wrong).toEqual([]);
  });

  it('keeps src/ free of DOM, Web Audio, Node APIs, three and howler', () => {
    const banned = /\b(window|document|navigator|AudioContext|OfflineAudioContext|AudioWorkletProcessor|AudioBuffer|localStorage|require|process\.|Buffer\.|__dirname)\b/;
    const bannedSpec = /^(node:|fs$|path$|os$|child_process$|three|howler|tweakpane|@tweakpane)/;
    const wrong: string[] = [];
    const files = walk(join(root, 'src'));
    expect(files.length).toBeGreaterThan(10);
    for (const file of files) {
      const text = readFileSync(file, 'utf8');
      for (const spec of importsOf(text)) if (bannedSpec.test(spec)) wrong.push(`${relative(root, file)} imports ${spec}`);
      const code = text.replace(/\/\*[\s\S]*?\*\//g, '').replace(/\/\/.*$/gm, '').replace(/(['"`])(?:\\.|(?!\1).)*\1/g, '""');
      const m = code.match(banned);
      if (m) wrong.push(`${relative(root, file)} uses ${m[0]}`);
    }
    expect(wrong).toEqual([]);
  });

  it('detects a wrong-way import when one is present', () => {
    // Guards the checker itself: a synthetic src file importing the runtime must be flagged.
    const spec = importsOf("import { x } from '../../runtime/host';")[0];
    expect(layerOf(resolve(root, 'src/engine', spec))).toBe('runtime');
  });
});
