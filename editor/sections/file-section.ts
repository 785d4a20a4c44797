// Tuning file section: undo/redo, save (back to the file it came from where the browser allows, else a download),
// save a copy, load (problems listed by JSON path), reset, and the autosave with its last few versions.
import type { BindingApi } from '@tweakpane/core';
import type { ButtonApi, FolderApi, Pane } from 'tweakpane';
import type { TuningProblem } from '../tuning-store';
import { createJsonFileInput } from './json-file-input';
import { problemList } from './problem-list';

/** Callbacks of the tuning file section. */
export interface FileActions {
  undo(): void;
  redo(): void;
  save(): void;
  saveCopy(): void;
  /** The Load button: the open picker where available, else the hidden input. */
  openFile(input: HTMLInputElement): void;
  loadText(text: string, fileName: string): void;
  reset(): void;
  autosave: { enabled: boolean };
  autosaveChanged(): void;
  /** Restores autosaved version `index` (0 = newest). */
  restoreVersion(index: number): void;
}

/** The file section; show() lists problems of the last load (empty = success message). */
export class FileSection {
  readonly folder: FolderApi;
  /** The hidden file input (tests set files on it directly). */
  readonly input: HTMLInputElement;
  private readonly status: HTMLDivElement;
  private readonly doc: Document;
  private readonly undoButton: ButtonApi;
  private readonly redoButton: ButtonApi;
  private readonly saveButton: ButtonApi;
  private readonly versions = { pick: -1 };
  private versionsBinding: BindingApi | null = null;
  private readonly actions: FileActions;

  constructor(pane: Pane, doc: Document, actions: FileActions) {
    this.doc = doc;
    this.actions = actions;
    this.folder = pane.addFolder({ title: 'Tuning file' });
    const f = this.folder;
    const add = (title: string, tip: string, click: () => void) => {
      const b = f.addButton({ title });
      b.element.title = tip;
      b.on('click', click);
      return b;
    };
    this.undoButton = add('Undo', 'Undo the last edit, load or reset (Ctrl/Cmd+Z).', () => actions.undo());
    this.redoButton = add('Redo', 'Redo (Ctrl/Cmd+Shift+Z).', () => actions.redo());
    this.saveButton = add('Save tuning', 'Write the tuning back to the file it was loaded from where the browser allows it; otherwise download it.', () => actions.save());
    add('Download a copy (.json)', 'Download the running tuning as a JSON file.', () => actions.saveCopy());
    this.input = createJsonFileInput(doc, 'ralenti-tuning-file', (text, name) => actions.loadText(text, name));
    add('Load tuning file…', 'Load a tuning file (asks first when there are unsaved edits; undo brings the old one back).', () => actions.openFile(this.input));
    add('Reset to built-in tuning', 'Replace the tuning with the built-in one (asks first when there are unsaved edits; undo brings it back).', () => actions.reset());
    const auto = f.addBinding(actions.autosave, 'enabled', { label: 'autosave (browser)' });
    auto.element.title = 'Keep the last few versions in this browser; a tuning is saved only after it has run for a moment without stopping the page.';
    auto.on('change', () => actions.autosaveChanged());
    this.status = doc.createElement('div');
    this.status.className = 'rl-file-status';
    this.status.setAttribute('role', 'status');
    this.status.setAttribute('aria-live', 'polite');
    f.addBlade({ view: 'ralenti-element', element: this.status });
  }

  /** Enables the buttons and names the steps they would take ('' = nothing); `where` is the save target. */
  setState(undoWhat: string | null, redoWhat: string | null, saveTarget: string, dirty: boolean): void {
    this.undoButton.disabled = undoWhat === null;
    this.undoButton.element.title = undoWhat ? `Undo ${undoWhat} (Ctrl/Cmd+Z).` : 'Nothing to undo.';
    this.redoButton.disabled = redoWhat === null;
    this.redoButton.element.title = redoWhat ? `Redo ${redoWhat} (Ctrl/Cmd+Shift+Z).` : 'Nothing to redo.';
    this.saveButton.title = dirty ? `Save tuning • (${saveTarget})` : `Save tuning (${saveTarget})`;
  }

  /** Lists the autosaved versions (label per version, newest first) to restore from. */
  setVersions(labels: readonly string[]): void {
    this.versionsBinding?.dispose();
    this.versionsBinding = null;
    if (labels.length < 2) return;
    this.versions.pick = -1;
    const options: Record<string, number> = { 'restore a version…': -1 };
    labels.forEach((l, i) => (options[l] = i));
    this.versionsBinding = this.folder.addBinding(this.versions, 'pick', { label: 'autosaved', options, index: this.folder.children.length - 1 });
    this.versionsBinding.element.title = 'The last few autosaved versions, newest first; picking one loads it (undo takes it back).';
    this.versionsBinding.on('change', () => {
      if (this.versions.pick >= 0) this.actions.restoreVersion(this.versions.pick);
    });
  }

  /** Shows a result line, and the problem list (by JSON path) when there are problems. */
  show(message: string, problems: readonly TuningProblem[] = []): void {
    this.status.replaceChildren();
    const line = this.doc.createElement('div');
    line.className = problems.length ? 'rl-file-bad' : 'rl-file-ok';
    line.textContent = message;
    this.status.appendChild(line);
    if (!problems.length) return;
    this.status.appendChild(problemList(this.doc, problems, 'rl-file-problems'));
  }
}
