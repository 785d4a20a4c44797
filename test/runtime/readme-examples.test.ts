// The README quotes runtime/examples/*.ts (which tsc checks) with package import paths; this keeps them in step.
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

describe('README runtime examples', () => {
  it.each(['three-howler-game.ts', 'worklet-loading.ts'])('quotes runtime/examples/%s verbatim (imports as package paths)', (file) => {
    const body = readFileSync(resolve(root, 'runtime/examples', file), 'utf8').split('\n').slice(1).join('\n').trimEnd();
    const readme = readFileSync(resolve(root, 'README.md'), 'utf8');
    expect(readme).toContain('```ts\n' + toPackagePaths(body) + '\n```');
  });
});
