// README.md and docs/guide.md quote runtime/examples/*.ts (which tsc checks) with package import paths; this keeps them
// in step. The consumer test (test/package/) builds the README's two snippets against the packed tarball.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';

const root = resolve(__dirname, '../..');
const toPackagePaths = (s: string) =>
  s.replace("'../howler/index'", "'ralenti/howler'").replace("'../three/index'", "'ralenti/three'")
    .replace("'../inline'", "'ralenti/runtime/inline'").replace("'../index'", "'ralenti/runtime'");

describe('README editor example', () => {
  it('quotes editor/examples/mount-in-game.ts verbatim (imports as package paths)', () => {
    const body = readFileSync(resolve(root, 'editor/examples/mount-in-game.ts'), 'utf8').split('\n').slice(1).join('\n').trimEnd()
      .replace("'../../runtime/index'", "'ralenti/runtime'").replace("'../index'", "'ralenti/editor'");
    expect(readFileSync(resolve(root, 'README.md'), 'utf8')).toContain('```ts\n' + body + '\n```');
  });
});

describe('README and guide runtime examples', () => {
  it.each([
    ['three-howler-game.ts', 'docs/guide.md'],
    ['worklet-loading.ts', 'docs/guide.md'],
    ['readme-three-howler.ts', 'README.md'],
    ['readme-web-audio.ts', 'README.md'],
  ])('quotes runtime/examples/%s verbatim in %s (imports as package paths)', (file, doc) => {
    const body = readFileSync(resolve(root, 'runtime/examples', file), 'utf8').split('\n').slice(1).join('\n').trimEnd();
    const text = readFileSync(resolve(root, doc), 'utf8');
    expect(text).toContain('```ts\n' + toPackagePaths(body) + '\n```');
  });

  it('keeps the README snippets short (at most 20 lines each)', () => {
    for (const file of ['readme-three-howler.ts', 'readme-web-audio.ts']) {
      const lines = readFileSync(resolve(root, 'runtime/examples', file), 'utf8').trimEnd().split('\n').length - 1;
      expect(lines, file).toBeLessThanOrEqual(20);
    }
  });
});
