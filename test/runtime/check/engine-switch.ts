// One switch for the checker's engine tests while the engine moves to the propagation model (issue 11).
import type { Tuning } from '../../../src/tuning';

/**
 * False while the engine on main renders Doppler with the same-instant formula and a default 50 ms Doppler smoothing
 * (plus 30 ms ratio smoothing), which the independent checker rightly fails. The engine tests then run the engine with
 * the instant model and no smoothing (engineTuning below). Flip to true once the propagation model, with no default
 * ratio smoothing, is on main: the tests then run the engine with its default tuning and expect propagation.
 */
export const ENGINE_HAS_PROPAGATION = false;

/** The tuning the engine tests render with: the default once propagation lands, else instant Doppler, no smoothing. */
export function engineTuning(t: Tuning): Tuning {
  if (ENGINE_HAS_PROPAGATION) return t;
  return { ...t, doppler: { ...t.doppler, smoothingSeconds: 0 }, smoothing: { ...t.smoothing, ratioSeconds: 0 } };
}

/** `t` with group `group`'s Doppler model switch set (the per-group switch of the propagation tuning). */
export function withDopplerModel(t: Tuning, group: string, model: 'propagation' | 'instant' | 'off'): Tuning {
  // Before the switch exists in the tuning types the field is a boolean; the checker reads a string there too.
  return { ...t, groups: { ...t.groups, [group]: { ...t.groups[group], doppler: model as unknown as boolean } } };
}
