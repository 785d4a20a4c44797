// The difference of two tuning documents as a list of JSON paths with the value on each side.

/** One difference: the JSON path, and the value in A and in B (undefined: absent on that side). */
export interface TuningDifference {
  readonly path: string;
  readonly a: unknown;
  readonly b: unknown;
}

function isObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function join(path: string, key: string | number): string {
  if (typeof key === 'number') return `${path}[${key}]`;
  return path ? `${path}.${key}` : key;
}

/** Lists every leaf where `a` and `b` differ, by JSON path (curves' keys element by element), in document order. */
export function diffTunings(a: unknown, b: unknown, path = '', out: TuningDifference[] = []): TuningDifference[] {
  if (Array.isArray(a) && Array.isArray(b)) {
    const n = Math.max(a.length, b.length);
    for (let i = 0; i < n; i++) diffTunings(a[i], b[i], join(path, i), out);
    return out;
  }
  if (isObject(a) && isObject(b)) {
    const keys = [...Object.keys(a), ...Object.keys(b).filter((k) => !(k in a))];
    for (const k of keys) diffTunings(a[k], b[k], join(path, k), out);
    return out;
  }
  if (a !== b) out.push({ path, a, b });
  return out;
}

/** Short text of one side's value for the diff list ('–' when absent). */
export function diffValueText(v: unknown): string {
  if (v === undefined) return '–';
  if (typeof v === 'number') return String(Number(v.toPrecision(6)));
  return JSON.stringify(v);
}
