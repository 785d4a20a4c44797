// Inlined variant of the runtime entry: the processor's source is embedded and loaded from a Blob URL,
// so a game's bundler needs no configuration. Built by scripts/build.mjs, which defines the source text.
import { createRalenti as createWithUrl, type CreateRalentiOptions } from './create-ralenti';
import type { Ralenti } from './ralenti';
import { RalentiOptionError } from './runtime-error';
import { workletBlobUrl } from './worklet-url';

export * from './index';

/** Replaced by scripts/build.mjs with the bundled processor's source text. */
declare const __RALENTI_WORKLET_SOURCE__: string | undefined;

let cachedUrl: string | null = null;

/** Blob URL of the embedded processor (created once per page). */
export function inlineWorkletUrl(): string {
  if (cachedUrl) return cachedUrl;
  const source = typeof __RALENTI_WORKLET_SOURCE__ === 'string' ? __RALENTI_WORKLET_SOURCE__ : undefined;
  if (!source) throw new RalentiOptionError('workletUrl', 'the processor source is embedded only in the dist/ build; pass workletUrl instead');
  cachedUrl = workletBlobUrl(source);
  return cachedUrl;
}

/** createRalenti loading the embedded processor unless `workletUrl` is given. */
export function createRalenti(context: BaseAudioContext, options: CreateRalentiOptions = {}): Promise<Ralenti> {
  return createWithUrl(context, { ...options, workletUrl: options.workletUrl ?? inlineWorkletUrl() });
}
