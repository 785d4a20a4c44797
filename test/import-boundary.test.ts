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

/** Relative and package imports with whether each brings in types only (import type, or every name marked type). */
function importsWithKind(text: string): { spec: string; typeOnly: boolean }[] {
  const out: { spec: string; typeOnly: boolean }[] = [];
  const re = /(import|export)\s+(type\s+)?([^'";]*?)\s*from\s*['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)|import\s*['"]([^'"]+)['"]/g;
  for (const m of text.matchAll(re)) {
    if (m[4] !== undefined) {
      const names = /^\{([^}]*)\}$/.exec(m[3].trim());
      const allTyped = names !== null && names[1].split(',').map((n) => n.trim()).filter((n) => n !== '').every((n) => n.startsWith('type '));
      out.push({ spec: m[4], typeOnly: m[2] !== undefined || allTyped });
    } else out.push({ spec: m[5] ?? m[6], typeOnly: false });
  }
  return out;
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

  it('keeps runtime/check independent of the engine it checks: no value import from src/motion, src/dilation, src/engine or the src/ barrel', () => {
    // An expectation computed by the code under test is not a check: the checker may use types from there, nothing else.
    const forbidden = ['src/motion', 'src/dilation', 'src/engine'].map((d) => resolve(root, d));
    const barrel = resolve(root, 'src/index');
    const files = walk(join(root, 'runtime/check'));
    expect(files.length).toBeGreaterThan(3);
    const wrong: string[] = [];
    for (const file of files) {
      for (const { spec, typeOnly } of importsWithKind(readFileSync(file, 'utf8'))) {
        if (!spec.startsWith('.') || typeOnly) continue;
        const target = resolve(dirname(file), spec).replace(/\.(ts|js)$/, '').replace(/[\\/]index$/, '');
        if (target === barrel.replace(/[\\/]index$/, '') || target === barrel || forbidden.some((f) => target === f || target.startsWith(f + '/') || target.startsWith(f + '\\'))) wrong.push(`${relative(root, file)} → ${spec}`);
      }
    }
    expect(wrong).toEqual([]);
  });

  it('reaches a folder of src/ from outside it only through its index.ts (DEVELOPERS.md), so no folder cycle hides', () => {
    const srcRoot = resolve(root, 'src');
    const wrong: string[] = [];
    let checked = 0;
    for (const layer of layers) {
      for (const file of walk(join(root, layer))) {
        if (resolve(file) === join(srcRoot, 'index.ts')) continue; // the package barrel re-exports the folders' type files
        const rel = relative(srcRoot, file).split(/[\\/]/);
        const ownFolder = rel[0] !== '..' && rel.length > 1 ? rel[0] : null;
        for (const spec of importsOf(readFileSync(file, 'utf8'))) {
          if (!spec.startsWith('.')) continue;
          const target = relative(srcRoot, resolve(dirname(file), spec).replace(/\.(ts|js)$/, '')).split(/[\\/]/);
          if (target[0] === '..' || target[0] === ownFolder) continue;
          checked++;
          if (target.length > 2 || (target.length === 2 && target[1] !== 'index')) wrong.push(`${relative(root, file)} → ${spec}`);
        }
      }
    }
    expect(checked).toBeGreaterThan(20);
    expect(wrong).toEqual([]);
  });

  it('tells a type-only import from a value import', () => {
    expect(importsWithKind("import type { A } from '../../src/engine';\nimport { b } from '../../src/motion';").map((i) => i.typeOnly)).toEqual([true, false]);
    expect(importsWithKind("export type { A } from '../src/dilation';\nimport { type A, type B } from '../src/engine';").map((i) => i.typeOnly)).toEqual([true, true]);
  });

  it('detects a wrong-way import when one is present', () => {
    // Guards the checker itself: a synthetic src file importing the runtime must be flagged.
    const spec = importsOf("import { x } from '../../runtime/host';")[0];
    expect(layerOf(resolve(root, 'src/engine', spec))).toBe('runtime');
  });
});

/**
 * Files that still hold inline copies of the unit formulas, allowed for now: they are being restructured by others
 * (issue 17) and move to src/dsp/conversions.ts there. Shrink only: remove an entry once its file is clean (the test
 * below fails for an entry with nothing left to allow, or a file that no longer exists); add none.
 */
const INLINE_UNIT_FORMULA_ALLOWANCE: readonly string[] = [];

/** The one file where dB ↔ gain and cents ↔ ratio are written out (dbToGain, gainToDb, centsToRatio, ratioToCents). */
const CONVERSIONS_FILE = 'src/dsp/conversions.ts';

/** Inline copies of 20·log10(g), 10^(dB/20), 1200·log2(r) and 2^(cents/1200), as written in TypeScript. */
const INLINE_UNIT_FORMULAS: readonly RegExp[] = [
  /\b1200\s*\*\s*Math\.log2\s*\(/,
  /Math\.log2\s*\([^;]*\)\s*\*\s*1200\b/,
  /Math\.pow\s*\(\s*2\s*,[^;]*\/\s*1200\b/,
  /(?<![\w.])2\s*\*\*\s*\([^;]*\/\s*1200\b/,
  /\b20\s*\*\s*Math\.log10\s*\(/,
  /Math\.log10\s*\([^;]*\)\s*\*\s*20\b/,
  /Math\.pow\s*\(\s*10\s*,[^;]*\/\s*20\b/,
  /(?<![\w.])10\s*\*\*\s*\([^;]*\/\s*20\b/,
];

/** Lines of `text` (comments removed; strings kept, since template literals hold code) with an inline unit formula. */
function inlineUnitFormulas(text: string): string[] {
  const code = text.replace(/\/\*[\s\S]*?\*\//g, '').replace(/(^|[^:'"`])\/\/.*$/gm, '$1');
  return code.split('\n').filter((line) => INLINE_UNIT_FORMULAS.some((re) => re.test(line))).map((line) => line.trim());
}

describe('unit formulas in one place', () => {
  it('writes dB ↔ gain and cents ↔ ratio only in src/dsp/conversions.ts (outside the shrinking allowance list)', () => {
    const wrong: string[] = [];
    let checked = 0;
    for (const layer of layers) {
      for (const file of walk(join(root, layer))) {
        const rel = relative(root, file).split(/[\\/]/).join('/');
        if (rel === CONVERSIONS_FILE || INLINE_UNIT_FORMULA_ALLOWANCE.includes(rel)) continue;
        checked++;
        for (const line of inlineUnitFormulas(readFileSync(file, 'utf8'))) wrong.push(`${rel}: ${line} (use dbToGain, gainToDb, centsToRatio or ratioToCents)`);
      }
    }
    expect(checked).toBeGreaterThan(100);
    expect(wrong).toEqual([]);
  });

  it('keeps the allowance list shrinking: every entry is a file that still holds an inline copy', () => {
    const stale = INLINE_UNIT_FORMULA_ALLOWANCE.filter((rel) => {
      try {
        return inlineUnitFormulas(readFileSync(join(root, rel), 'utf8')).length === 0;
      } catch {
        return true; // the file is gone
      }
    });
    expect(stale, 'remove these from INLINE_UNIT_FORMULA_ALLOWANCE').toEqual([]);
  });

  it.each([
    ['const db = 20 * Math.log10(gain);', true],
    ['const g = Math.pow(10, (a - b) / 20);', true],
    ['const g = peak * 10 ** (-45 / 20);', true],
    ['const c = 1200 * Math.log2(f / ref);', true],
    ['const r = Math.pow(2, curve.evaluate(s) / 1200);', true],
    ['const r = v * 2 ** (cents / 1200);', true],
    ['const label = `${(20 * Math.log10(peak)).toFixed(1)} dB`;', true],
    ['const db = gainToDb(gain); // 20 * Math.log10(gain)', false],
    ['const mag = 10 ** Math.floor(Math.log10(raw));', false],
    ['const attenuationDb = 4 * 10 * Math.log10(1 + x * x);', false],
    ['const f = 440 * 2 ** ((note - 69) / 12);', false],
  ])('tells an inline copy from other maths: %s → %s', (line, found) => {
    expect(inlineUnitFormulas(line).length > 0).toBe(found);
  });
});
