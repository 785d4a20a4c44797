// Tuning file section: download, load a file (problems listed by JSON path), reset, autosave; and the A/B section.
import type { FolderApi, Pane } from 'tweakpane';
import type { TuningProblem } from '../tuning-store';
import { createJsonFileInput } from './json-file-input';
import { problemList } from './problem-list';

/** Callbacks of the tuning file section. */
export interface FileActions {
  download(): void;
  loadText(text: string, fileName: string): void;
  reset(): void;
  autosave: { enabled: boolean };
  autosaveChanged(): void;
}

/** The file section; show() lists problems of the last load (empty = success message). */
export class FileSection {
  readonly folder: FolderApi;
  /** The hidden file input (tests set files on it directly). */
  readonly input: HTMLInputElement;
  private readonly status: HTMLDivElement;
  private readonly doc: Document;

  constructor(pane: Pane, doc: Document, actions: FileActions) {
    this.doc = doc;
    this.folder = pane.addFolder({ title: 'Tuning file' });
    this.folder.addButton({ title: 'Download tuning (.json)' }).on('click', () => actions.download());
    this.input = createJsonFileInput(doc, 'ralenti-tuning-file', (text, name) => actions.loadText(text, name));
    this.folder.addButton({ title: 'Load tuning file…' }).on('click', () => this.input.click());
    this.folder.addButton({ title: 'Reset to built-in tuning' }).on('click', () => actions.reset());
    this.folder.addBinding(actions.autosave, 'enabled', { label: 'autosave (browser)' }).on('change', () => actions.autosaveChanged());
    this.status = doc.createElement('div');
    this.status.className = 'rl-file-status';
    this.status.setAttribute('role', 'status');
    this.status.setAttribute('aria-live', 'polite');
    this.folder.addBlade({ view: 'ralenti-element', element: this.status });
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

/** The A/B section: resampler tier and the playback path switch. */
export function addCompareSection(
  pane: Pane,
  draft: { resampler: { tier: string } },
  path: { mode: 'engine' | 'builtin' },
  onTier: (last: boolean) => void,
  onPath: () => void,
): FolderApi {
  const f = pane.addFolder({ title: 'A/B compare', expanded: false });
  f.addBinding(draft.resampler, 'tier', { label: 'resampler', options: { draft: 'draft', standard: 'standard', high: 'high' } }).on('change', (e) => onTier(e.last));
  f.addBinding(path, 'mode', {
    label: 'playback path',
    options: { 'Ralenti engine': 'engine', 'browser playbackRate': 'builtin' },
  }).on('change', () => onPath());
  return f;
}
