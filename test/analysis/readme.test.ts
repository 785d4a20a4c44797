import { describe, expect, it, vi } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';

const root = resolve(__dirname, '../..');

function exampleFromFile(): string {
  const text = readFileSync(resolve(__dirname, 'readme-example.ts'), 'utf8');
  const body = text.split('// README-EXAMPLE-START\n')[1].split('// README-EXAMPLE-END')[0];
  return body.replace("from '../../src/analysis'", "from 'ralenti/analysis'").trim();
}

function exampleFromReadme(): string {
  const readme = readFileSync(resolve(root, 'docs', 'guide.md'), 'utf8');
  const section = readme.split('## Pitch analysis')[1] ?? '';
  return (section.split('```ts\n')[1] ?? '').split('```')[0].trim();
}

describe('docs/guide.md pitch analysis example', () => {
  it('is the same code as test/analysis/readme-example.ts', () => {
    expect(exampleFromReadme()).toBe(exampleFromFile());
  });

  it('runs and finds the 440 Hz tone within a cent', async () => {
    const log = vi.spyOn(console, 'log').mockImplementation(() => {});
    const { stats } = await import('./readme-example');
    log.mockRestore();
    expect(stats.count).toBeGreaterThan(90);
    expect(stats.maxCents).toBeLessThan(1);
  });
});
