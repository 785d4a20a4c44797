// Types of scripts/build-cli.mjs for TypeScript callers (tests).
/** Builds the CLI bundle to `outfile` (default dist/cli/ralenti.mjs); resolves to the absolute path written. */
export function buildCli(options?: { outfile?: string; minify?: boolean }): Promise<string>;
