// A numeric tuning field: range from the format's limits table, values stored rounded to the field's step, typed text
// that is not a number reverted with a notice, values outside the range clamped with a notice, a tooltip with unit
// and range. Wide ranges (more than 100000 steps) get a text field without a slider.
import type { BindingApi } from '@tweakpane/core';
import type { FolderApi, TabPageApi, Pane } from 'tweakpane';
import { numberLimit, roundToStep, stepDecimals, tooltipOf, type FieldSpec } from '../field-specs';
import type { Announcer } from './announcer';

/** Anything tweakpane bindings can be added to. */
export type FieldParent = Pane | FolderApi | TabPageApi;

/** Largest number of steps a slider spans; wider fields are text only. */
const MAX_SLIDER_STEPS = 100000;

/** Adds a binding for `target[key]` described by `spec`; `changed(last)` runs after each stored change. */
export function addNumberField(
  parent: FieldParent,
  target: Record<string, unknown>,
  key: string,
  spec: FieldSpec,
  notice: Announcer,
  changed: (last: boolean) => void,
): BindingApi {
  const limit = numberLimit(spec);
  const decimals = stepDecimals(spec.step);
  const slider = (limit.max - limit.min) / spec.step <= MAX_SLIDER_STEPS;
  const binding = parent.addBinding(target, key, {
    label: spec.label,
    step: spec.step,
    format: (v: number) => v.toFixed(decimals),
    ...(slider ? { min: limit.min, max: limit.max } : {}),
  });
  binding.element.title = tooltipOf(spec);
  binding.element.dataset.field = spec.path;
  // Rounded to the step, then kept inside the range (a limit off the step grid, like 0.01 with step 1, stays reachable).
  const clampAndRound = (v: number): number => Math.min(limit.max, Math.max(limit.min, roundToStep(v, spec.step)));
  binding.on('change', (e) => {
    const v = e.value as number;
    const stored = clampAndRound(v);
    if (stored !== v) {
      target[key] = stored;
      binding.refresh();
    }
    changed(e.last);
  });
  // Typed text: tweakpane parses it on 'change'; this capture listener sees the raw text first.
  binding.element.addEventListener(
    'change',
    (ev) => {
      const input = ev.target as HTMLInputElement | null;
      if (!input || input.tagName !== 'INPUT') return;
      const text = input.value.trim();
      const n = Number(text);
      const before = target[key];
      if (text === '' || !Number.isFinite(n)) {
        queueMicrotask(() => {
          if (target[key] === before) {
            binding.refresh();
            notice.say(`${spec.label}: "${text}" is not a number; kept ${formatValue(before, decimals)}.`, 'warn');
          }
        });
        return;
      }
      if (n < limit.min || n > limit.max) {
        const to = clampAndRound(n);
        notice.say(`${spec.label}: ${text} is outside ${limit.min}…${limit.max}${spec.unit ? ` ${spec.unit}` : ''}; set to ${formatValue(to, decimals)}.`, 'warn');
      }
    },
    true,
  );
  return binding;
}

function formatValue(v: unknown, decimals: number): string {
  return typeof v === 'number' ? v.toFixed(decimals) : String(v);
}

/** Adds a list binding for an enum field or a checkbox for a boolean field, with the tooltip; `options` maps labels to values. */
export function addChoiceField(
  parent: FieldParent,
  target: Record<string, unknown>,
  key: string,
  spec: FieldSpec,
  changed: (last: boolean) => void,
  options?: Record<string, string>,
): BindingApi {
  const l = spec.limit;
  const opts = l.kind === 'enum' ? (options ?? Object.fromEntries(l.values.map((v) => [v, v]))) : undefined;
  const binding = parent.addBinding(target, key, { label: spec.label, ...(opts ? { options: opts } : {}) });
  binding.element.title = tooltipOf(spec);
  binding.element.dataset.field = spec.path;
  binding.on('change', (e) => changed(e.last));
  return binding;
}
