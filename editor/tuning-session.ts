// The designer's session over tuning texts, free of the DOM: the undo history, the saved tuning (what "unsaved edits"
// are measured against), the two tunings held for A/B, and the autosave that commits a version only after the tuning
// has run for a while without the page failing.
import { TuningHistory, type HistoryEntry } from './tuning-history';
import { pushAutosaveVersion } from './autosave-versions';

/** Frozen defaults of TuningSession. */
export const tuningSessionDefaults = Object.freeze({
  /** Animation frames a changed tuning must run without an error before it is autosaved (about 0.5 s at 60 Hz). */
  surviveFrames: 30,
});

/** Construction options of TuningSession. */
export interface TuningSessionOptions {
  /** The running tuning's text at the start. */
  initialText: string;
  /** Where autosaved versions go (undefined: no autosave). */
  storage?: Storage;
  /** Clock for the versions' timestamps, ms (the page's Date.now). */
  now: () => number;
  /** Frames a change must survive before autosave (1…600; default 30). */
  surviveFrames?: number;
}

/** A pending autosave: the text and the frames it still has to survive. */
interface PendingSave {
  text: string;
  framesLeft: number;
  errors: number;
}

/** History, saved state, A/B and autosave of one editing session. */
export class TuningSession {
  /** Undo/redo over every committed edit, load and reset. */
  readonly history: TuningHistory;
  /** Text of the tuning as last saved to or loaded from a file (or the starting tuning). */
  saved: string;
  /** Tuning A for comparison: the saved one unless a file was loaded into A. */
  readonly a = { text: '', name: 'saved', fromFile: false };
  /** Which tuning plays: A or B (the working tuning, where edits go). */
  side: 'A' | 'B' = 'B';
  /** The autosave switch the panel binds to. */
  readonly autosaveSwitch = { enabled: true };
  /** Last autosave outcome, for the status line ('' = none yet). */
  lastAutosave = '';
  private pending: PendingSave | null = null;
  private readonly options: TuningSessionOptions;
  private readonly surviveFrames: number;

  constructor(options: TuningSessionOptions) {
    this.options = options;
    this.surviveFrames = Math.max(1, Math.min(600, options.surviveFrames ?? tuningSessionDefaults.surviveFrames));
    this.history = new TuningHistory({ text: options.initialText, what: 'start' });
    this.saved = options.initialText;
    this.a.text = options.initialText;
  }

  /** The working tuning's text (B). */
  get working(): string {
    return this.history.current.text;
  }

  /** True when the working tuning differs from the saved one. */
  get dirty(): boolean {
    return this.working !== this.saved;
  }

  /** True while an autosave waits for its tuning to prove it runs. */
  get autosavePending(): boolean {
    return this.pending !== null;
  }

  /** Records a new working tuning (an edit, load, reset or restore); returns false when nothing changed. */
  commit(text: string, what: string): boolean {
    const changed = this.history.push({ text, what });
    if (changed) this.schedule(text);
    return changed;
  }

  /** Steps back; returns the entry now in effect or null. */
  undo(): HistoryEntry | null {
    const e = this.history.undo();
    if (e) this.schedule(e.text);
    return e;
  }

  /** Steps forward; returns the entry now in effect or null. */
  redo(): HistoryEntry | null {
    const e = this.history.redo();
    if (e) this.schedule(e.text);
    return e;
  }

  /** The working tuning was written to a file (or loaded from one): it is the saved tuning, and A unless A is a file. */
  markSaved(text: string): void {
    this.saved = text;
    if (!this.a.fromFile) this.a.text = text;
  }

  /** Holds `text` as tuning A, from the file `name`. */
  setA(text: string, name: string): void {
    this.a.text = text;
    this.a.name = name;
    this.a.fromFile = true;
  }

  /** The text that should be playing now (A or the working tuning). */
  get playing(): string {
    return this.side === 'A' ? this.a.text : this.working;
  }

  /** Call once per animation frame the page survives, with the runtime's error count; returns true when it autosaved. */
  frame(errors: number): boolean {
    const p = this.pending;
    if (!p) return false;
    if (Number.isNaN(p.errors)) p.errors = errors; // the first frame after the change sets the baseline
    if (errors !== p.errors) {
      this.cancelAutosave('the audio thread reported an error after this change');
      return false;
    }
    if (--p.framesLeft > 0) return false;
    this.pending = null;
    const ok = pushAutosaveVersion(this.options.storage, p.text, this.options.now());
    this.lastAutosave = ok ? 'autosaved' : 'autosave refused by the browser storage';
    return ok;
  }

  /** Drops the pending autosave (the page failed after the change); says why in lastAutosave. */
  cancelAutosave(reason: string): void {
    if (!this.pending) return;
    this.pending = null;
    this.lastAutosave = `not autosaved: ${reason}`;
  }

  /** Arms the autosave for `text` (its error baseline is taken at the next frame). */
  private schedule(text: string): void {
    if (!this.autosaveSwitch.enabled || !this.options.storage) return;
    this.pending = { text, framesLeft: this.surviveFrames, errors: NaN };
  }
}
