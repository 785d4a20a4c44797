// Undo/redo over whole tuning documents: every committed edit, load and reset is one step.

/** One entry of the history: the serialized tuning and what produced it. */
export interface HistoryEntry {
  /** Tuning text (serializeTuning output). */
  readonly text: string;
  /** Short description shown on the buttons' tooltips ('edit', 'load ralenti.json', 'reset'). */
  readonly what: string;
}

/** Frozen defaults of TuningHistory. */
export const tuningHistoryDefaults = Object.freeze({ limit: 200 });

/** A linear undo/redo stack of tuning texts; identical consecutive texts are one entry. */
export class TuningHistory {
  private readonly entries: HistoryEntry[] = [];
  private index = -1;
  private readonly limit: number;

  /** Starts with `initial` as the only entry; keeps at most `limit` (2…10000) entries. */
  constructor(initial: HistoryEntry, options: { limit?: number } = {}) {
    this.limit = Math.max(2, Math.min(10000, options.limit ?? tuningHistoryDefaults.limit));
    this.entries.push(initial);
    this.index = 0;
  }

  /** The entry in effect now. */
  get current(): HistoryEntry {
    return this.entries[this.index];
  }

  /** True when undo() has a step to go back to. */
  get canUndo(): boolean {
    return this.index > 0;
  }

  /** True when redo() has a step to go forward to. */
  get canRedo(): boolean {
    return this.index < this.entries.length - 1;
  }

  /** What undo would take back (null: nothing). */
  get undoWhat(): string | null {
    return this.canUndo ? this.entries[this.index].what : null;
  }

  /** What redo would bring back (null: nothing). */
  get redoWhat(): string | null {
    return this.canRedo ? this.entries[this.index + 1].what : null;
  }

  /** Records a new state after the current one (drops the redo branch); returns false when it equals the current. */
  push(entry: HistoryEntry): boolean {
    if (entry.text === this.current.text) return false;
    this.entries.length = this.index + 1;
    this.entries.push(entry);
    if (this.entries.length > this.limit) this.entries.shift();
    this.index = this.entries.length - 1;
    return true;
  }

  /** Steps back; returns the entry now in effect, or null when there is nothing to undo. */
  undo(): HistoryEntry | null {
    if (!this.canUndo) return null;
    this.index--;
    return this.current;
  }

  /** Steps forward; returns the entry now in effect, or null when there is nothing to redo. */
  redo(): HistoryEntry | null {
    if (!this.canRedo) return null;
    this.index++;
    return this.current;
  }
}
