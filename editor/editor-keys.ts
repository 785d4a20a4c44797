// The editor's keys: Ctrl/Cmd+Z undo, Ctrl/Cmd+Shift+Z (or Ctrl+Y) redo, and one key that toggles A/B; none of them
// while the user types in a field (the field's own undo applies there).

/** What a key press asks the editor to do, or null. */
export type EditorKeyAction = 'undo' | 'redo' | 'toggle-compare' | null;

function typing(e: KeyboardEvent): boolean {
  const t = e.target as HTMLElement | null;
  if (!t || typeof t.tagName !== 'string') return false;
  const tag = t.tagName.toUpperCase();
  return (tag === 'INPUT' && (t as HTMLInputElement).type !== 'checkbox') || tag === 'TEXTAREA' || tag === 'SELECT' || t.isContentEditable === true;
}

/** Maps a keydown to an editor action; `compareKey` is the KeyboardEvent.key that toggles A/B. */
export function editorKeyAction(e: KeyboardEvent, compareKey: string): EditorKeyAction {
  if (e.defaultPrevented || e.repeat || typing(e)) return null;
  const mod = e.ctrlKey || e.metaKey;
  const key = e.key.toLowerCase();
  if (mod && !e.altKey && key === 'z') return e.shiftKey ? 'redo' : 'undo';
  if (mod && !e.altKey && !e.shiftKey && key === 'y') return 'redo';
  if (!mod && !e.altKey && e.key === compareKey) return 'toggle-compare';
  return null;
}
