// The mix stage of a voice: adds its block into a stereo bus with the gain stage's per-sample linear ramps, in
// TypeScript or in the WebAssembly module's `mix` (f64 lanes, the same operations) when the buffers live in its memory,
// or with the tone stage's staged low-pass in the module's `lowpassMix` (filtered and mixed in one pass).
import type { WasmKernel } from '../dsp';
import type { VoiceGain } from './voice-gain';
import type { VoiceTone } from './voice-tone';

/**
 * Adds `frames` of `x0`/`x1` (left/right; the same array for a mono sound) into mixL/mixR from `offset`, ramped by
 * `gain.rampGains` (left0, leftStep, right0, rightStep); through `wasm` when non-null (every array then a view of its memory).
 * `tone`, when non-null, left its low-pass of x0/x1 staged in the module: the module filters and mixes in one pass.
 * Returns false when the input was not finite (the caller then clears its filter state).
 */
export function mixBlock(x0: Float32Array, x1: Float32Array, mixL: Float32Array, mixR: Float32Array, offset: number, frames: number, gain: VoiceGain, wasm: WasmKernel | null, tone: VoiceTone | null = null): boolean {
  // From the ramp's array, not the getters: a getter V8 does not inline boxes the double it returns.
  const ramp = gain.rampGains;
  const gl0 = ramp[0];
  const dgl = ramp[1];
  const gr0 = ramp[2];
  const dgr = ramp[3];
  if (wasm !== null) {
    // The gains go into the module's parameter block; only small integers cross the call (no boxed doubles).
    const g = wasm.mixGains;
    g[0] = gl0;
    g[1] = dgl;
    g[2] = gr0;
    g[3] = dgr;
    if (tone !== null) return tone.mixPending(wasm, x0.byteOffset, x1.byteOffset, mixL.byteOffset + 4 * offset, mixR.byteOffset + 4 * offset, frames);
    return wasm.mix(x0.byteOffset, x1.byteOffset, mixL.byteOffset + 4 * offset, mixR.byteOffset + 4 * offset, frames) !== 0;
  }
  let check = 0;
  for (let i = 0; i < frames; i++) {
    const a = x0[i];
    const b = x1[i];
    mixL[offset + i] += a * (gl0 + dgl * (i + 1));
    mixR[offset + i] += b * (gr0 + dgr * (i + 1));
    check += a + b;
  }
  return check - check === 0;
}
