// Where the bundled processor lives by default: beside the module that bundles this file (dist/ralenti-processor.js).

/** Default processor URL, resolved against this module's URL (correct for the dist/ bundles). */
export function defaultWorkletUrl(): string {
  return new URL('./ralenti-processor.js', import.meta.url).href;
}

/** Makes a Blob URL for processor source text (the inlined variant); revoke it with URL.revokeObjectURL when done. */
export function workletBlobUrl(source: string): string {
  return URL.createObjectURL(new Blob([source], { type: 'text/javascript' }));
}
