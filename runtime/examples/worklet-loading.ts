// docs/guide.md example: the two ways to load the worklet (type-checked; docs/guide.md quotes it with package imports).
import { createRalenti } from '../index';
import { createRalenti as createRalentiInline } from '../inline';

/** Option 1: serve dist/ralenti-processor.js yourself and pass its URL. */
export async function withWorkletFile(ctx: AudioContext) {
  return createRalenti(ctx, { workletUrl: '/assets/ralenti-processor.js' });
}

/** Option 2: the inlined entry embeds the processor and loads it from a Blob URL; no bundler setup. */
export async function withInlinedWorklet(ctx: AudioContext) {
  return createRalentiInline(ctx);
}
