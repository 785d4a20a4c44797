// Compare: two tunings held side by side — A (the saved tuning, or a file loaded into A) and B (the edited one) —
// switched live with a key; their differences listed by JSON path. Also the resampler tier and, where the page has
// comparison sources, the playback path (engine or the browser's playbackRate).
import type { BindingApi } from '@tweakpane/core';
import type { FolderApi, Pane } from 'tweakpane';
import { diffTunings, diffValueText, type TuningDifference } from '../tuning-diff';
import { createJsonFileInput } from './json-file-input';
import { addField, type TunableContext } from './tunable-sections';

/** Which tuning plays. */
export type CompareSide = 'A' | 'B';

/** Callbacks and state of the compare section. */
export interface CompareActions {
  /** Current side (the section edits `side.now`). */
  side: { now: CompareSide };
  /** The side switch changed. */
  switched(): void;
  /** A file was picked to load into A. */
  loadIntoA(text: string, name: string): void;
  /** Playback path, when the page offers the built-in comparison. */
  path: { mode: 'engine' | 'builtin' } | null;
  pathChanged(): void;
  /** Name of the key that toggles A/B (KeyboardEvent.key), shown in the tooltip. */
  key: string;
}

/** The compare folder; showDiff() refreshes the list. */
export class CompareSection {
  readonly folder: FolderApi;
  /** Hidden file input of "Load file into A…" (tests set files on it). */
  readonly input: HTMLInputElement;
  private readonly list: HTMLDivElement;
  private readonly sideBinding: BindingApi;
  private readonly aLabel = { name: 'saved' };

  constructor(pane: Pane, ctx: TunableContext, actions: CompareActions) {
    const doc = pane.element.ownerDocument;
    this.folder = pane.addFolder({ title: 'A/B compare', expanded: false });
    const key = actions.key === '`' ? 'the ` key' : `the ${actions.key} key`;
    this.sideBinding = this.folder.addBinding(actions.side, 'now', { label: 'listening to', options: { 'A · saved': 'A', 'B · edited': 'B' } });
    this.sideBinding.element.title = `Switch between tuning A (saved, or a file loaded into A) and B (your edits); ${key} toggles. Edits always go to B.`;
    this.sideBinding.on('change', () => actions.switched());
    const a = this.folder.addBinding(this.aLabel, 'name', { label: 'A is', readonly: true });
    a.element.title = 'Where tuning A came from: the last saved or loaded tuning, or a file loaded into A.';
    this.input = createJsonFileInput(doc, 'ralenti-compare-file', (text, name) => actions.loadIntoA(text, name));
    const b = this.folder.addButton({ title: 'Load file into A…' });
    b.element.title = 'Compare your edits with another tuning file (it is not applied until you listen to A).';
    b.on('click', () => this.input.click());
    this.list = doc.createElement('div');
    this.list.className = 'rl-diff';
    this.list.title = 'Differences between A and B by JSON path: A value → B value.';
    this.folder.addBlade({ view: 'ralenti-element', element: this.list });
    addField(this.folder, ctx, 'resampler.tier');
    if (actions.path) {
      const p = this.folder.addBinding(actions.path, 'mode', { label: 'playback path', options: { 'Ralenti engine': 'engine', 'browser playbackRate': 'builtin' } });
      p.element.title = 'Hear the engine, or the same sources through the browser’s own playbackRate resampler (readouts follow what you hear).';
      p.on('change', () => actions.pathChanged());
    }
  }

  /** Names A's origin ('saved' or a file name). */
  setAName(name: string): void {
    this.aLabel.name = name;
  }

  /** Refreshes the side switch after a key press. */
  refresh(): void {
    this.sideBinding.refresh();
  }

  /** Lists the differences of A and B (parsed JSON documents). */
  showDiff(a: unknown, b: unknown): TuningDifference[] {
    const d = diffTunings(a, b);
    const doc = this.list.ownerDocument;
    this.list.replaceChildren();
    const head = doc.createElement('div');
    head.className = 'rl-diff-head';
    head.textContent = d.length === 0 ? 'A and B are the same.' : `${d.length} difference${d.length === 1 ? '' : 's'} (A → B):`;
    this.list.appendChild(head);
    for (const x of d.slice(0, 60)) {
      const row = doc.createElement('div');
      const code = doc.createElement('code');
      code.textContent = x.path;
      row.append(code, ` ${diffValueText(x.a)} → ${diffValueText(x.b)}`);
      this.list.appendChild(row);
    }
    if (d.length > 60) this.list.appendChild(doc.createTextNode(`… and ${d.length - 60} more`));
    return d;
  }
}
