// Types of scripts/build-worklet.mjs for TypeScript callers (tests, benchmarks).

/** Entry file of the processor. */
export declare const workletEntry: string;
/** File name of the bundled processor inside an output folder. */
export declare const workletFileName: string;
/** Writes <outdir>/ralenti-processor.js; resolves to its path. */
export declare function buildWorklet(options: { outdir: string; minify?: boolean }): Promise<string>;
/** Bundles the processor in memory; resolves to its source text (default minified). */
export declare function workletSourceText(options?: { minify?: boolean }): Promise<string>;
