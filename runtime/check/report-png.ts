// Rasterises the report SVG to PNG with resvg (a general-purpose SVG renderer, its WebAssembly build from the npm
// registry), loaded on demand so that the runtime itself never depends on it. Text uses a font file found on the
// machine (DejaVu or Liberation Sans, common on Linux); without one, text is left out of the PNG (the SVG keeps it).
import { existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';

const FONT_CANDIDATES = [
  '/usr/share/fonts/truetype/dejavu/DejaVuSans.ttf',
  '/usr/share/fonts/truetype/liberation/LiberationSans-Regular.ttf',
  '/usr/share/fonts/TTF/DejaVuSans.ttf',
  '/System/Library/Fonts/Supplemental/Arial.ttf',
  'C:\\Windows\\Fonts\\arial.ttf',
];

interface ResvgModule {
  initWasm(input: Uint8Array): Promise<void>;
  Resvg: new (svg: string, options: unknown) => { render(): { asPng(): Uint8Array } };
}

let ready: Promise<ResvgModule> | null = null;

async function resvg(): Promise<ResvgModule> {
  ready ??= (async () => {
    const name = '@resvg/resvg-wasm';
    let mod: ResvgModule;
    let wasm: Uint8Array;
    try {
      mod = (await import(/* @vite-ignore */ name)) as ResvgModule;
      wasm = readFileSync(createRequire(import.meta.url).resolve(`${name}/index_bg.wasm`));
    } catch {
      throw new Error('writing a PNG report needs the package @resvg/resvg-wasm (npm install @resvg/resvg-wasm); .svg and .html need nothing');
    }
    await mod.initWasm(wasm);
    return mod;
  })();
  return ready;
}

/** PNG bytes of `svg` at its own size (scale 1…4, default 1). */
export async function svgToPng(svg: string, scale = 1): Promise<Uint8Array> {
  const mod = await resvg();
  const fonts = FONT_CANDIDATES.filter((f) => existsSync(f)).map((f) => new Uint8Array(readFileSync(f)));
  const r = new mod.Resvg(svg, { fitTo: { mode: 'zoom', value: Math.min(4, Math.max(1, scale)) }, font: { fontBuffers: fonts, loadSystemFonts: false, defaultFontFamily: 'DejaVu Sans' }, background: '#ffffff' });
  return r.render().asPng();
}
