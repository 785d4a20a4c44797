// Where a tuning file came from and how to write it back: the File System Access API (a file handle from the open
// picker, written in place) where the browser has it, a download elsewhere. See docs/references.md §17.

/** The part of FileSystemFileHandle the editor uses. */
export interface TuningFileHandle {
  readonly name: string;
  getFile(): Promise<File>;
  createWritable(): Promise<{ write(data: string): Promise<void>; close(): Promise<void> }>;
}

type OpenPicker = (options: unknown) => Promise<TuningFileHandle[]>;

/** The browser's open picker, or null where the File System Access API is absent. */
export function openPickerOf(win: Window | null): OpenPicker | null {
  if (win === null || !('showOpenFilePicker' in win)) return null;
  const p = win.showOpenFilePicker;
  return isFunction(p) ? p.bind(win) : null;
}

// The DOM library has no type for the picker (it is not in every browser): its result is read as TuningFileHandle[].
const isFunction = (v: unknown): v is OpenPicker => typeof v === 'function';

/** Asks the user for a JSON file through the open picker; resolves with its handle, or null when cancelled. */
export async function pickTuningFile(picker: OpenPicker): Promise<TuningFileHandle | null> {
  try {
    const [h] = await picker({ types: [{ description: 'Tuning (JSON)', accept: { 'application/json': ['.json'] } }], multiple: false });
    return h ?? null;
  } catch {
    return null; // cancelled (AbortError) or refused
  }
}

/** Replaces the file's contents with `text`. */
export async function writeTuningFile(handle: TuningFileHandle, text: string): Promise<void> {
  const w = await handle.createWritable();
  await w.write(text);
  await w.close();
}
