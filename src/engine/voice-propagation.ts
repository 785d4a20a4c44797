// A propagating voice's per-block hooks: its Doppler factors and arrival from its source's emission-time solution
// (retarded time, docs/physics.md), and the air-absorption cutoff (ISO 9613-1) merged into its tone low-pass.
import type { Vec3Like } from '../units';
import type { SourceState } from '../dilation';
import type { AirAbsorption } from '../motion';
import { OPEN_CUTOFF_HZ } from '../tuning';
import type { PropagationStage } from './propagation-stage';
import { EMISSION_NONE } from './emission-solver';
import type { Voice } from './voice';

/** A propagating voice on a source no snapshot has named yet waits this long for it, then plays non-positioned, s. */
export const SOURCE_WAIT_SECONDS = 0.25;
/** Air-absorption cutoff below which a propagating voice's low-pass engages (and then stays engaged), Hz. */
export const AIR_ENGAGE_HZ = 16000;
/** Highest cutoff the air stage asks for: just below the bypass threshold, so an engaged low-pass stays engaged. */
const AIR_OPEN_HZ = OPEN_CUTOFF_HZ * 0.999;

/**
 * A propagating voice's block of `n` frames starting at engine time `now` (s): its Doppler factors at the block's
 * ends and mean, its arrival (the sound reaches the listener when the emission time passes the voice's start), and
 * the source state at emission time for gains and panning, written into `emission` (null: non-positioned).
 */
export function propagateVoice(
  stage: PropagationStage, v: Voice, slot: number, n: number, now: number, sampleRate: number, emission: SourceState & { velocity: Vec3Like },
): (SourceState & { velocity: Vec3Like }) | null {
  if (slot < 0) {
    if (!v.arrived && now - v.startTime >= SOURCE_WAIT_SECONDS) v.arriveAt(0, 0);
    v.setDoppler(v.dopplerEnd, 1, NaN);
    return null;
  }
  const sol = stage.now[slot];
  const pre = stage.before[slot];
  const start = v.fresh ? (pre.state !== EMISSION_NONE ? pre.doppler : sol.doppler) : v.dopplerEnd;
  v.setDoppler(start, sol.state !== EMISSION_NONE ? sol.doppler : v.dopplerEnd, sol.meanDoppler);
  if (!v.arrived && sol.state !== EMISSION_NONE && sol.tau >= v.startTime) {
    const span = sol.tau - pre.tau;
    const block = n / sampleRate;
    if (pre.state !== EMISSION_NONE && pre.tau < v.startTime && span > 0 && span < 8 * block) {
      const k = Math.floor((n * (v.startTime - pre.tau)) / span);
      v.arriveAt(k < 0 ? 0 : k >= n ? n - 1 : k, 0);
    } else {
      // A Mach cone: silent until its estimated arrival inside the block, the emission it jumped over skipped.
      const k = Math.floor((sol.coneTime - now) * sampleRate);
      v.arriveAt(k > 0 ? (k < n ? k : n - 1) : 0, sol.tau - v.startTime > block ? (sol.tau - v.startTime) * sampleRate : 0);
    }
  }
  emission.id = v.params.sourceId;
  emission.position.x = sol.position.x;
  emission.position.y = sol.position.y;
  emission.position.z = sol.position.z;
  return emission;
}

/**
 * Air absorption joins the dilation tone in the same low-pass: the cutoff becomes min(tone, f₃(distance)). Once the
 * air asks for less than AIR_ENGAGE_HZ the low-pass stays engaged for the voice's life: no bypass switching each time
 * the distance crosses the open cutoff (engaging restarts the filter, audible on a close pass); near voices skip it.
 */
export function airStage(v: Voice, air: AirAbsorption): void {
  const t = v.targets;
  const cut = air.cutoffHz(t.distance);
  if (cut < AIR_ENGAGE_HZ) v.engageAir();
  if (!v.airEngaged) return;
  if (cut < t.cutoffHz) t.cutoffHz = cut < AIR_OPEN_HZ ? cut : AIR_OPEN_HZ;
  else if (t.cutoffHz > AIR_OPEN_HZ) t.cutoffHz = AIR_OPEN_HZ;
}
