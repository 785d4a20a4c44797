// Byte layout of the parameter blocks the kernel module's block functions read (wasm/resample-kernel.ts): the
// JavaScript side writes one block per call into module memory and passes its address, instead of 9–15 arguments.

/** `render` block (also read by `sanitize` and `ramp`), byte offsets of i32 fields: table header, sources x0/x1, span base frame, outputs, sample range, ratios. */
export const RP_TABLE = 0;
/** Source x0 (byte address). */
export const RP_X0 = 4;
/** Source x1 (byte address; 0 = mono). */
export const RP_X1 = 8;
/** Source frame of float 0 of x0/x1 (i32). */
export const RP_SPAN_BASE = 12;
/** Output out0 (byte address). */
export const RP_OUT0 = 16;
/** Output out1 (byte address). */
export const RP_OUT1 = 20;
/** First output sample of the call (i32). */
export const RP_I_START = 24;
/** End of the call's output samples, exclusive (i32). */
export const RP_I_END = 28;
/** Per-sample ratios (byte address of f64s), written by `sanitize` or `ramp`. */
export const RP_RATIOS = 32;
/** Written by the kernel: the last stride used (i32). */
export const RP_STRIDE = 36;
/** Read position, source frames (f64): the start on entry, the end on return. */
export const RP_POS = 40;
/** Frames of the whole block (f64; read by `ramp`). */
export const RP_FRAMES = 48;
/** Ratio at sample 0 of the linear ramp (f64; read by `ramp`). */
export const RP_RS = 56;
/** Ratio change across the block (f64; read by `ramp`). */
export const RP_DR = 64;
/** Loop end, source frames (f64; Infinity = none): the call stops after the sample that reaches it. */
export const RP_LOOP_END = 72;
/** Raw per-sample ratios that `sanitize` reads (byte address of f32s). */
export const RP_RAW = 80;
/** Ratios `sanitize` reads (i32). */
export const RP_COUNT = 84;
/** The last in-range ratio (f64; ReadCursor.lastRatio): read and written by `sanitize`. */
export const RP_LAST = 88;
/** Written by `sanitize` and `ramp`: the smallest ratio of the run (f64; `render` reads it). */
export const RP_LO = 96;
/** Written by `sanitize` and `ramp`: the largest ratio of the run (f64). */
export const RP_HI = 104;
/** Bytes of a `render` block. */
export const RENDER_PARAM_BYTES = 112;

/** `mix` block: source x0 (byte address). */
export const MP_X0 = 0;
/** Source x1 (byte address). */
export const MP_X1 = 4;
/** Left mix bus at the block's offset (byte address). */
export const MP_MIX_L = 8;
/** Right mix bus at the block's offset (byte address). */
export const MP_MIX_R = 12;
/** Frames to mix (i32). */
export const MP_FRAMES = 16;
/** Left gain before sample 0 (f64); the four gains are contiguous (WasmKernel.mixGains views them). */
export const MP_GL0 = 24;
/** Left gain step per sample (f64). */
export const MP_DGL = 32;
/** Right gain before sample 0 (f64). */
export const MP_GR0 = 40;
/** Right gain step per sample (f64). */
export const MP_DGR = 48;
/** Bytes of a `mix` block. */
export const MIX_PARAM_BYTES = 56;

/** `lowpass` block (wasm/lowpass.ts): channel x0 (byte address). */
export const LP_X0 = 0;
/** Channel x1 (byte address). */
export const LP_X1 = 4;
/** Frames to filter (i32; at most LP_SETS sub-blocks). */
export const LP_FRAMES = 8;
/** Frames per sub-block (i32): each has its own coefficients. */
export const LP_SUB = 12;
/** State as f64 pairs (x0's, x1's): x[n−1], x[n−2], y[n−1], y[n−2]; read and written back. */
export const LP_STATE = 16;
/** Coefficients b0, b1, b2, a1, a2 (f64 each, normalised by a0) of sub-block 0, then LP_SET_BYTES per further sub-block. */
export const LP_COEF = 80;
/** Bytes of one sub-block's coefficients. */
export const LP_SET_BYTES = 40;
/** Sub-blocks one `lowpass` call filters at most. */
export const LP_SETS = 4;
/** Bytes of a `lowpass` block. */
export const LOWPASS_PARAM_BYTES = LP_COEF + LP_SETS * LP_SET_BYTES;

/** `buildStride` block (i32 fields, byte offsets): table header, dense table, dense length, stride, descriptor, rows, diffs. */
export const BP_TABLE = 0;
/** Dense table (byte address). */
export const BP_DENSE = 4;
/** Dense entries, taps × phases (i32). */
export const BP_TOTAL = 8;
/** The stride laid out (i32). */
export const BP_STRIDE = 12;
/** Its descriptors (byte address). */
export const BP_DESC = 16;
/** Its residue rows (byte address). */
export const BP_ROWS = 20;
/** Its difference rows (byte address). */
export const BP_DIFFS = 24;
/** Bytes of a `buildStride` block. */
export const BUILD_PARAM_BYTES = 28;
