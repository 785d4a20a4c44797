// The editor entry for any page (`ralenti/editor`, for development builds): one call mounts the tuning panel in a
// dock on the game's own page, over its running Ralenti, and keeps it updated.
import type { Ralenti, RalentiSource, RalentiVoice } from '../runtime';
import { EditorPanel, type EditorHost } from './editor-panel';
import { EditorDock } from './editor-dock';
import { VoiceNames } from './voice-names';

/** Options of mountEditor; every one is optional. */
export interface MountEditorOptions extends Partial<Omit<EditorHost, 'ralenti' | 'container' | 'names' | 'storage'>> {
  /** Element the dock is added to (default: document.body). */
  parent?: HTMLElement;
  /** id given to the dock element (default none). */
  id?: string;
  /** Build the panel in this element instead of a dock (then there is no resizing or folding). */
  container?: HTMLElement;
  /** Storage for the autosave and the dock's width; null turns both off (default: localStorage). */
  storage?: Storage | null;
  /** Restore the autosaved tuning on mount when it differs from the running one (default true; undo returns to the game's). */
  restoreAutosave?: boolean;
  /** Drive panel.update() from requestAnimationFrame (default true); false: call it from your own frame loop. */
  autoUpdate?: boolean;
  /** Names for the readouts: voices by RalentiVoice and sources by RalentiSource, or a VoiceNames the page keeps up to date. */
  names?: VoiceNames | { voices?: [RalentiVoice, string][]; sources?: [RalentiSource, string][] };
}

/** A mounted editor. */
export interface MountedEditor {
  /** The panel (loadText, undo, redo, save, listenTo, session, …). */
  readonly panel: EditorPanel;
  /** The element the panel sits in (the dock, or your container). */
  readonly element: HTMLElement;
  /** Names a voice in the readouts. */
  nameVoice(voice: RalentiVoice | number, name: string): void;
  /** Names a source: its voices show this name unless named themselves. */
  nameSource(source: RalentiSource | number, name: string): void;
  /** Removes the panel, the dock and the update loop. */
  dispose(): void;
}

function defaultStorage(doc: Document): Storage | undefined {
  try {
    return doc.defaultView?.localStorage ?? undefined;
  } catch {
    return undefined; // storage blocked (sandboxed frame, privacy mode)
  }
}

/** Mounts the tuning panel on `ralenti` in this page (a dock on the right, unless `options.container` is given). */
export function mountEditor(ralenti: Ralenti, options: MountEditorOptions = {}): MountedEditor {
  const doc = options.container?.ownerDocument ?? options.parent?.ownerDocument ?? document;
  const storage = options.storage === null ? undefined : (options.storage ?? defaultStorage(doc));
  const dock = options.container ? null : new EditorDock(doc, options.parent ?? doc.body, storage);
  const given = options.names;
  const names = given instanceof VoiceNames ? given : new VoiceNames();
  if (given && !(given instanceof VoiceNames)) {
    for (const [v, n] of given.voices ?? []) names.nameVoice(v.id, n);
    for (const [s, n] of given.sources ?? []) names.nameSource(s.id, n);
  }
  if (dock && options.id) dock.element.id = options.id;
  const { parent: _p, container, storage: _s, restoreAutosave, autoUpdate, names: _n, id: _i, ...host } = options;
  const panel = new EditorPanel({ ...host, ralenti, container: container ?? dock!.body, names, storage });
  if (restoreAutosave !== false) panel.restoreAutosave();
  let frame = 0;
  const win = doc.defaultView;
  const tick = () => {
    panel.update();
    frame = win?.requestAnimationFrame(tick) ?? 0;
  };
  if (autoUpdate !== false && win) frame = win.requestAnimationFrame(tick);
  return {
    panel,
    element: dock?.element ?? container!,
    nameVoice: (voice, name) => void names.nameVoice(typeof voice === 'number' ? voice : voice.id, name),
    nameSource: (source, name) => names.nameSource(typeof source === 'number' ? source : source.id, name),
    dispose: () => {
      if (frame) win?.cancelAnimationFrame(frame);
      panel.dispose();
      dock?.dispose();
    },
  };
}
