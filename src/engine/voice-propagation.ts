// A propagating voice's per-block hooks: its Doppler factors and arrival from its source's emission-time solution
// (retarded time, docs/physics.md), and the air-absorption cutoff (ISO 9613-1) merged into its tone low-pass.
import type { Vec3Like } from '../units';
import type { SourceState } from '../dilation';
import type { AirAbsorption } from '../motion';
import { OPEN_CUTOFF_HZ } from '../tuning';
import type { PropagationStage } from './propagation-stage';
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
    v.loseEmission(now, SOURCE_WAIT_SECONDS);
    return null;
  }
  const sol = stage.now[slot];
  v.followEmission(stage.before[slot], sol, n, now, sampleRate);
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
