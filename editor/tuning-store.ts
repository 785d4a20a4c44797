// Tuning file handling for the editor: autosave to localStorage, restore, download as JSON, read an uploaded file.
import { parseTuning, serializeTuning, TuningError } from '../runtime';
import type { CurveSpec, Tuning } from '../src';

/** localStorage key of the autosaved tuning. */
export const AUTOSAVE_KEY = 'ralenti.tuning.autosave';
/** File name offered for downloads. */
export const DOWNLOAD_NAME = 'ralenti-tuning.json';

/** One problem found while loading a tuning file: JSON path ('' = the whole document) and message. */
export interface TuningProblem {
  path: string;
  message: string;
}

/** Result of reading a tuning document from text. */
export type TuningReadResult = { ok: true; tuning: Tuning; json: unknown } | { ok: false; problems: TuningProblem[] };

/** Parses text as a tuning document; JSON syntax errors and schema problems come back as problems with paths. */
export function readTuningText(text: string): TuningReadResult {
  try {
    // The text itself goes to parseTuning: it refuses oversized text before parsing and reports duplicate keys.
    const tuning = parseTuning(text);
    return { ok: true, tuning, json: JSON.parse(text) };
  } catch (err) {
    if (err instanceof TuningError) return { ok: false, problems: err.issues.map((i) => ({ path: i.path, message: i.message })) };
    return { ok: false, problems: [{ path: '', message: String((err as Error)?.message ?? err) }] };
  }
}

/** The autosaved tuning, or null when there is none or it no longer parses (then the problems say why). */
export function loadAutosaved(storage: Storage | undefined): { tuning: Tuning | null; problems: TuningProblem[] } {
  let text: string | null = null;
  try {
    text = storage?.getItem(AUTOSAVE_KEY) ?? null;
  } catch {
    return { tuning: null, problems: [] };
  }
  if (text === null) return { tuning: null, problems: [] };
  const r = readTuningText(text);
  return r.ok ? { tuning: r.tuning, problems: [] } : { tuning: null, problems: r.problems };
}

/** Writes the tuning to localStorage; returns false when storage refuses (private mode, quota). */
export function autosave(storage: Storage | undefined, tuning: Tuning): boolean {
  try {
    storage?.setItem(AUTOSAVE_KEY, serializeTuning(tuning));
    return !!storage;
  } catch {
    return false;
  }
}

/** Removes the autosaved tuning. */
export function clearAutosave(storage: Storage | undefined): void {
  try {
    storage?.removeItem(AUTOSAVE_KEY);
  } catch {
    // Storage unavailable: nothing to clear.
  }
}

/** Offers the tuning as a JSON file download. */
export function downloadTuning(doc: Document, tuning: Tuning, fileName = DOWNLOAD_NAME): void {
  downloadJson(doc, serializeTuning(tuning), fileName);
}

/** Offers JSON text as a file download named `fileName` (through a temporary hidden link). */
export function downloadJson(doc: Document, text: string, fileName: string): void {
  const url = URL.createObjectURL(new Blob([text], { type: 'application/json' }));
  const a = doc.createElement('a');
  a.href = url;
  a.download = fileName;
  a.style.display = 'none';
  doc.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** A mutable deep copy of a tuning, for the panel's bindings to edit. */
export function editableCopy(tuning: Tuning): MutableTuning {
  return JSON.parse(serializeTuning(tuning)) as MutableTuning;
}

/**
 * Mutable view of Tuning (the panel edits a plain copy, then validates it through setTuning). Scalars are edited in
 * place; curves are replaced whole by the frozen specs the curve blades give, so they keep CurveSpec's readonly type.
 */
export type MutableTuning = { -readonly [K in keyof Tuning]: Mutable<Tuning[K]> };
/** A deeply mutable group of the panel's draft. */
export type MutableGroup = MutableTuning['groups'][string];
type Mutable<T> = T extends CurveSpec ? CurveSpec : T extends readonly (infer U)[] ? Mutable<U>[] : T extends object ? { -readonly [K in keyof T]: Mutable<T[K]> } : T;
