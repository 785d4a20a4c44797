// The autosave keeps the last few versions of the tuning in localStorage (newest first); the newest is also kept
// under the single key older builds read, so that an existing autosave still restores.
import { AUTOSAVE_KEY } from './tuning-store';

/** localStorage key of the version list. */
export const AUTOSAVE_VERSIONS_KEY = 'ralenti.tuning.autosave.versions';

/** Frozen defaults of the autosave. */
export const autosaveDefaults = Object.freeze({ versions: 5 });

/** One autosaved version: the tuning text and when it was saved (ms since 1970, from the page's clock). */
export interface AutosavedVersion {
  readonly text: string;
  readonly savedAt: number;
}

/** The saved versions, newest first (empty when there are none or storage is unavailable). */
export function readAutosaveVersions(storage: Storage | undefined): AutosavedVersion[] {
  try {
    const raw = storage?.getItem(AUTOSAVE_VERSIONS_KEY);
    const list = raw ? (JSON.parse(raw) as unknown) : [];
    if (Array.isArray(list)) return list.filter((v): v is AutosavedVersion => typeof v?.text === 'string' && typeof v?.savedAt === 'number');
  } catch {
    // Unreadable list: start a new one.
  }
  return [];
}

/** Adds `text` as the newest version (an identical newest is not repeated); returns false when storage refuses. */
export function pushAutosaveVersion(storage: Storage | undefined, text: string, savedAt: number, keep = autosaveDefaults.versions): boolean {
  if (!storage) return false;
  const list = readAutosaveVersions(storage);
  if (list[0]?.text !== text) list.unshift({ text, savedAt });
  try {
    storage.setItem(AUTOSAVE_VERSIONS_KEY, JSON.stringify(list.slice(0, Math.max(1, keep))));
    storage.setItem(AUTOSAVE_KEY, text);
    return true;
  } catch {
    return false;
  }
}
