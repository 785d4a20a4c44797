// The machine's ceiling for the resampler's arithmetic: f32x4 multiply-adds of resident table rows against a resident
// source (WebAssembly fixed-width SIMD, no fused multiply-add), the best a dot-product kernel can do per tap here.
// Compiled in the bench from the AssemblyScript below (the project's devDependency); not shipped.

/** AssemblyScript source of the probe: `dots` runs `outputs` dot products of `rowFloats` (a multiple of 8) each. */
const PROBE_SOURCE = `
@inline function hsum(a: v128): f32 {
  const t = f32x4.add(a, v128.shuffle<f32>(a, a, 2, 3, 0, 1));
  return f32x4.extract_lane(f32x4.add(t, v128.shuffle<f32>(t, t, 1, 0, 3, 2)), 0);
}
export function dots(table: usize, rowFloats: i32, rows: i32, x: usize, xFloats: i32, outputs: i32, out: usize): void {
  let row = 0;
  let xi = 0;
  const quad = rowFloats & ~15;
  for (let i = 0; i < outputs; i++) {
    const tp = table + (<usize>(row * rowFloats) << 2);
    const xp = x + (<usize>xi << 2);
    let a0 = f32x4.splat(0);
    let a1 = f32x4.splat(0);
    let a2 = f32x4.splat(0);
    let a3 = f32x4.splat(0);
    let j = 0;
    for (; j < quad; j += 16) {
      const jo = <usize>j << 2;
      a0 = f32x4.add(a0, f32x4.mul(v128.load(tp + jo), v128.load(xp + jo)));
      a1 = f32x4.add(a1, f32x4.mul(v128.load(tp + jo, 16), v128.load(xp + jo, 16)));
      a2 = f32x4.add(a2, f32x4.mul(v128.load(tp + jo, 32), v128.load(xp + jo, 32)));
      a3 = f32x4.add(a3, f32x4.mul(v128.load(tp + jo, 48), v128.load(xp + jo, 48)));
    }
    if (j < rowFloats) {
      const jo = <usize>j << 2;
      a0 = f32x4.add(a0, f32x4.mul(v128.load(tp + jo), v128.load(xp + jo)));
      a1 = f32x4.add(a1, f32x4.mul(v128.load(tp + jo, 16), v128.load(xp + jo, 16)));
    }
    store<f32>(out + (<usize>(i & 127) << 2), hsum(f32x4.add(f32x4.add(a0, a1), f32x4.add(a2, a3))));
    // The next output reads another phase row and a source window one frame on, as a resampler does.
    row += 97;
    if (row >= rows) row -= rows;
    xi += 1;
    if (xi + rowFloats >= xFloats) xi = 0;
  }
}
`;

interface ProbeExports {
  memory: { buffer: ArrayBuffer; grow(pages: number): number };
  dots(table: number, rowFloats: number, rows: number, x: number, xFloats: number, outputs: number, out: number): void;
}

/** A compiled ceiling probe over a resident table of `rows` × `rowFloats` floats and a resident source. */
export class CeilingProbe {
  private readonly ex: ProbeExports;
  private readonly rowFloats: number;
  private readonly rows: number;
  private readonly table: number;
  private readonly x: number;
  private readonly xFloats: number;
  private readonly out: number;

  private constructor(ex: ProbeExports, rowFloats: number, rows: number, xFloats: number) {
    this.ex = ex;
    this.rowFloats = rowFloats;
    this.rows = rows;
    this.xFloats = xFloats;
    this.table = 1 << 16;
    this.x = this.table + 4 * rowFloats * rows + 64;
    this.out = this.x + 4 * xFloats + 64;
    const need = this.out + 4 * 128;
    const have = ex.memory.buffer.byteLength;
    if (need > have) ex.memory.grow(Math.ceil((need - have) / 65536));
    const f32 = new Float32Array(ex.memory.buffer);
    // Values like a kernel's and a signal's (finite, no denormals), so the arithmetic runs at its normal speed.
    for (let k = 0; k < rowFloats * rows; k++) f32[(this.table >> 2) + k] = Math.sin(0.37 * k) * 0.5;
    for (let k = 0; k < xFloats; k++) f32[(this.x >> 2) + k] = Math.sin(0.011 * k) * 0.25;
  }

  /** Compiles the probe (with SIMD) and places a table of `rows` rows of `rowFloats` floats (a multiple of 8) and a source of `xFloats`. */
  static async create(rowFloats: number, rows: number, xFloats: number): Promise<CeilingProbe> {
    const asc = (await import('assemblyscript/asc')) as unknown as {
      compileString(src: string, opts: object): Promise<{ binary?: Uint8Array<ArrayBuffer>; error?: Error | null; stderr: { toString(): string } }>;
    };
    const r = await asc.compileString(PROBE_SOURCE, { optimizeLevel: 3, runtime: 'stub', noAssert: true, enable: ['simd'], initialMemory: 1 });
    if (r.error || !r.binary) throw new Error(`ceiling probe did not compile: ${r.error?.message ?? ''} ${r.stderr.toString()}`);
    const instance = new WebAssembly.Instance(new WebAssembly.Module(r.binary), { env: { abort() {} } });
    return new CeilingProbe(instance.exports as unknown as ProbeExports, rowFloats, rows, xFloats);
  }

  /** Runs `outputs` dot products; returns the multiply-adds done (outputs × rowFloats). */
  run(outputs: number): number {
    this.ex.dots(this.table, this.rowFloats, this.rows, this.x, this.xFloats, outputs, this.out);
    return outputs * this.rowFloats;
  }
}
