// The tuning editor: a tweakpane panel over a running Ralenti, editing a draft tuning that is applied live, with undo,
// A/B of two tunings, honest fields, meters, and an autosave that never keeps a tuning that stopped the page.
import { Pane, type FolderApi } from 'tweakpane';
import type { RalentiAudioError } from '../runtime';
import { defaultTuning, serializeTuning } from '../runtime';
import { gainToDb, type Tuning } from '../src';
import { curveBladeBundle, type CurveBladeApi } from './curve-blade';
import { elementBladeBundle } from './element-blade';
import { PlaybackPath } from './playback-path';
import { CompareSection } from './sections/compare-section';
import { FileSection } from './sections/file-section';
import { GroupSection } from './sections/group-section';
import { ReadoutsSection } from './sections/readouts-section';
import { RecordingSection } from './sections/recording-section';
import { addDistanceSection, addDopplerSection, addListeningSection, addTimeFlowSection, type TunableContext } from './sections/tunable-sections';
import { downloadJson, DOWNLOAD_NAME, editableCopy, loadAutosaved, readTuningText, type MutableTuning, type TuningProblem } from './tuning-store';
import { readAutosaveVersions } from './autosave-versions';
import { editorCss } from './editor-style';
import { listeningGain } from './listening-level';
import { Announcer } from './controls/announcer';
import { GroupControls } from './group-controls';
import { captureViewState, emptyViewState, restoreViewState, type PanelViewState } from './panel-state';
import { TuningSession } from './tuning-session';
import { openPickerOf, pickTuningFile, writeTuningFile, type TuningFileHandle } from './tuning-file-access';
import { VoiceNames, type NamedVoice } from './voice-names';
import { editorKeyAction } from './editor-keys';
import { SoundDropTarget } from './sound-drop';
import type { EditorHost } from './editor-host';

export type { EditorHost };


/** The editor panel; call update() once per animation frame (mountEditor does it for you). */
export class EditorPanel {
  /** Problems of the last tuning load (empty after a good load). */
  lastProblems: readonly TuningProblem[] = [];
  /** The live listening volume in dB (master bus). */
  readonly volume = { db: -18 };
  /** Which path plays: the engine, or the browser's built-in playbackRate. */
  readonly path: { mode: 'engine' | 'builtin' };
  /** Undo history, saved state, A/B and autosave. */
  readonly session: TuningSession;
  /** Names shown in the readouts. */
  readonly names: VoiceNames;
  /** The status line (clamps, refused text, undo steps). */
  readonly notice: Announcer;
  private readonly host: EditorHost;
  private readonly doc: Document;
  private readonly builtin: PlaybackPath | null;
  private readonly buses: GroupControls;
  private readonly live = { timeScale: 1 };
  private readonly side = { now: 'B' as 'A' | 'B' };
  private pane!: Pane;
  private draft!: MutableTuning;
  private curves: CurveBladeApi[] = [];
  private folders: FolderApi[] = [];
  private groups!: GroupSection;
  private readouts!: ReadoutsSection;
  private file!: FileSection;
  private compare!: CompareSection;
  private recording: RecordingSection | null = null;
  private fileHandle: TuningFileHandle | null = null;
  private fileName = DOWNLOAD_NAME;
  private lastAudioError: RalentiAudioError | null = null;
  private readonly drop: SoundDropTarget;
  private readonly cleanup: (() => void)[] = [];

  constructor(host: EditorHost) {
    this.host = host;
    this.doc = host.container.ownerDocument;
    if (!this.doc.getElementById('ralenti-editor-css')) {
      const style = this.doc.createElement('style');
      style.id = 'ralenti-editor-css';
      style.textContent = editorCss;
      this.doc.head.appendChild(style);
    }
    this.names = host.names ?? new VoiceNames();
    for (const v of host.voices ?? []) this.names.voices.includes(v as NamedVoice) || this.names.voices.push(v as NamedVoice);
    this.notice = new Announcer(this.doc);
    const key = host.compareKey ?? '`';
    this.notice.say(`Ctrl/Cmd+Z undo · ${key} switches A/B${host.replaceSound ? ' · drop an audio file on a voice to hear it' : ''}`);
    this.notice.last = '';
    this.buses = new GroupControls(host.ralenti);
    if (host.master) this.volume.db = Math.round(gainToDb(Math.max(1e-6, host.master.gain.value)));
    const win = this.doc.defaultView;
    this.session = new TuningSession({ initialText: serializeTuning(host.ralenti.tuning), storage: host.storage, now: () => Date.now() });
    this.cleanup.push(host.ralenti.onError((e) => (this.lastAudioError = e)));
    const ctx = host.ralenti.context;
    const withBuiltin = host.comparison && host.comparison.length > 0 && host.master && host.engineBus;
    this.builtin = withBuiltin ? new PlaybackPath(host.ralenti, host.master!, host.engineBus!, host.comparison!) : null;
    this.path = this.builtin?.state ?? { mode: 'engine' };
    const onKey = (e: KeyboardEvent) => this.onKey(e);
    const onPageError = () => this.session.cancelAutosave('the page threw an error after this change');
    win?.addEventListener('keydown', onKey);
    win?.addEventListener('error', onPageError);
    this.cleanup.push(() => win?.removeEventListener('keydown', onKey), () => win?.removeEventListener('error', onPageError));
    this.drop = new SoundDropTarget(host.container, ctx, host.replaceSound ?? null, this.notice, () => this.groups.selected, () => host.ralenti.voices);
    this.build(emptyViewState());
    if (host.restoreProblems?.length) this.file.show('The autosaved tuning did not load; the built-in tuning runs.', host.restoreProblems);
    else if (host.restored) this.file.show('Restored the autosaved tuning.');
  }

  /** The running tuning (as the runtime validated it; tuning A while A is playing). */
  get tuning(): Tuning {
    return this.host.ralenti.tuning;
  }

  /** Loads tuning text as if from a file (asks first when there are unsaved edits); false when refused or declined. */
  loadText(text: string, fileName = 'tuning', handle: TuningFileHandle | null = null): boolean {
    const r = readTuningText(text);
    if (!r.ok) {
      this.lastProblems = r.problems;
      this.file.show(`${fileName}: not loaded (${r.problems.length} problem${r.problems.length === 1 ? '' : 's'}); the running tuning is unchanged.`, r.problems);
      return false;
    }
    if (!this.ask(`Load ${fileName}?`)) return false;
    this.lastProblems = [];
    this.fileHandle = handle;
    this.fileName = fileName;
    const loaded = serializeTuning(r.tuning);
    this.setWorking(loaded, `load ${fileName}`);
    this.session.markSaved(loaded);
    this.file.show(`${fileName}: loaded.${handle ? ' Save writes back to it.' : ''}`);
    return true;
  }

  /** Replaces the tuning with the built-in one (asks first when there are unsaved edits). */
  reset(): boolean {
    if (!this.ask('Reset to the built-in tuning?')) return false;
    this.setWorking(serializeTuning(defaultTuning), 'reset');
    this.file.show('Reset to the built-in tuning (undo brings your tuning back).');
    return true;
  }

  /** Makes the autosaved tuning the working one when it differs (undo returns to the running one); true when restored. */
  restoreAutosave(): boolean {
    const saved = loadAutosaved(this.host.storage);
    if (saved.problems.length) {
      this.file.show('The autosaved tuning did not load; the running tuning stays.', saved.problems);
      return false;
    }
    const text = saved.tuning ? serializeTuning(saved.tuning) : null;
    if (text === null || text === this.session.working) return false;
    this.setWorking(text, 'restore the autosave');
    this.file.show('Restored the autosaved tuning (undo returns to the one the page started with).');
    return true;
  }

  /** Undoes the last edit, load or reset. */
  undo(): void {
    const what = this.session.history.undoWhat;
    const e = this.session.undo();
    if (e) this.show(e.text, `Undid ${what}.`);
  }

  /** Redoes what undo took back. */
  redo(): void {
    const e = this.session.redo();
    if (e) this.show(e.text, `Redid ${e.what}.`);
  }

  /** Saves the working tuning: back to its file where the browser allows it, else as a download. */
  async save(): Promise<void> {
    const text = this.session.working;
    if (this.fileHandle) {
      try {
        await writeTuningFile(this.fileHandle, text);
        this.session.markSaved(text);
        this.file.show(`Saved to ${this.fileHandle.name}.`);
        this.afterChange();
        return;
      } catch (err) {
        this.file.show(`Could not write ${this.fileHandle.name} (${(err as Error).message}); downloading instead.`);
      }
    }
    downloadJson(this.doc, text, this.fileName);
    this.session.markSaved(text);
    this.file.show(`Saved as a download: ${this.fileName}.`);
    this.afterChange();
  }

  /** Plays tuning A or B (B = the working tuning, where edits go). */
  listenTo(side: 'A' | 'B'): void {
    this.session.side = side;
    this.side.now = side;
    this.host.ralenti.setTuning(JSON.parse(this.session.playing));
    this.compare.refresh();
    this.notice.say(side === 'A' ? `Listening to A (${this.session.a.name}).` : 'Listening to B (your edits).');
  }

  /** Per-frame update: curve markers, readouts, meters, the comparison path, the autosave. */
  update(): void {
    const ralenti = this.host.ralenti;
    const s = ralenti.timeScale;
    this.live.timeScale = s;
    for (const c of this.curves) if (c.marker !== s) c.marker = s;
    const now = ralenti.context.currentTime;
    const altPeak = this.builtin?.update();
    this.readouts.update({ stats: ralenti.stats, monitors: ralenti.voices, capacity: ralenti.capacity, lastError: this.lastAudioError, load: ralenti.renderLoad, now, altPeak });
    for (const [name, meter] of this.groups.meters) meter.push(this.buses.state(name)?.peak ?? null, now);
    this.recording?.update();
    if (this.session.frame(ralenti.stats.errors)) this.file.setVersions(this.versionLabels());
  }

  /** Removes the panel and its listeners. */
  dispose(): void {
    for (const f of this.cleanup) f();
    this.builtin?.stop();
    this.drop.dispose();
    this.teardown();
  }

  private build(view: PanelViewState): void {
    this.draft = editableCopy(JSON.parse(this.session.working) as Tuning);
    this.curves = [];
    this.pane = new Pane({ container: this.host.container, title: 'Ralenti tuning', expanded: view.paneExpanded });
    this.pane.registerPlugin(curveBladeBundle);
    this.pane.registerPlugin(elementBladeBundle);
    this.pane.addBlade({ view: 'ralenti-element', element: this.notice.element });
    const ctx: TunableContext = { draft: this.draft, curves: this.curves, changed: (last) => this.apply(last), notice: this.notice };
    const f: FolderApi[] = [];
    f.push(addTimeFlowSection(this.pane, ctx, this.live));
    this.groups = new GroupSection(this.pane, ctx, this.buses, view.group);
    f.push(this.groups.folder);
    f.push(addDopplerSection(this.pane, ctx), addDistanceSection(this.pane, ctx));
    this.readouts = new ReadoutsSection(this.pane, this.doc, this.host.ralenti.context, this.names);
    this.readouts.setPath(this.path.mode);
    (this.host.master ?? this.host.ralenti.node).connect(this.readouts.spectrum.analyser);
    this.compare = new CompareSection(this.pane, ctx, {
      side: this.side, switched: () => this.listenTo(this.side.now), loadIntoA: (t, n) => this.loadIntoA(t, n),
      path: this.builtin ? this.path : null, pathChanged: () => this.switchPath(), key: this.host.compareKey ?? '`',
    });
    this.compare.setAName(this.session.a.name);
    this.file = new FileSection(this.pane, this.doc, {
      undo: () => this.undo(), redo: () => this.redo(), save: () => void this.save(),
      saveCopy: () => downloadJson(this.doc, this.session.working, this.fileName), openFile: (input) => void this.openFile(input),
      loadText: (text, name) => this.loadText(text, name), reset: () => this.reset(),
      autosave: this.session.autosaveSwitch, autosaveChanged: () => this.afterChange(), restoreVersion: (i) => this.restoreVersion(i),
    });
    this.recording = this.host.recording ? new RecordingSection(this.pane, this.doc, this.host.recording) : null;
    f.push(this.readouts.folder, this.compare.folder, this.file.folder);
    if (this.recording) f.push(this.recording.folder);
    f.push(addListeningSection(this.pane, ctx, this.host.master ? this.volume : null, () => this.applyVolume()));
    this.folders = f;
    this.pane.element.classList.add('rl-pane');
    this.file.setVersions(this.versionLabels());
    restoreViewState(view, f, this.host.container, this.curves);
    this.afterChange();
  }

  private teardown(): void {
    try {
      (this.host.master ?? this.host.ralenti.node).disconnect(this.readouts.spectrum.analyser);
    } catch {
      // Not connected.
    }
    this.file.input.remove();
    this.compare.input.remove();
    this.recording?.dispose();
    this.pane.dispose();
  }

  /** Rebuilds the panel from the working tuning, keeping folders, group, scroll and key selections. */
  private rebuild(): void {
    const view = captureViewState(this.folders, this.groups.selected, this.host.container, this.curves, this.pane.expanded);
    this.teardown();
    this.build(view);
  }

  /** Makes `text` the working tuning as one history step, plays it, and shows it in the panel. */
  private setWorking(text: string, what: string): void {
    this.session.commit(text, what);
    this.show(text, '');
  }

  private show(text: string, message: string): void {
    if (this.session.side === 'A') this.listenTo('B');
    this.host.ralenti.setTuning(JSON.parse(text));
    this.rebuild();
    if (message) this.notice.say(message);
  }

  private apply(last: boolean): void {
    if (this.session.side === 'A') this.listenTo('B');
    let t: Tuning;
    try {
      t = this.host.ralenti.setTuning(this.draft);
    } catch (err) {
      const issues = (err as { issues?: TuningProblem[] }).issues ?? [{ path: '', message: String(err) }];
      this.file.show('That edit was refused; the running tuning is unchanged.', issues);
      return;
    }
    if (last) {
      this.session.commit(serializeTuning(t), 'edit');
      this.afterChange();
    }
  }

  private afterChange(): void {
    const s = this.session;
    const target = this.fileHandle ? this.fileHandle.name : `download ${this.fileName}`;
    this.file.setState(s.history.undoWhat, s.history.redoWhat, target, s.dirty);
    this.compare.showDiff(JSON.parse(s.a.text), JSON.parse(s.working));
  }

  private ask(what: string): boolean {
    if (!this.session.dirty) return true;
    const ask = this.host.confirm ?? ((m: string) => this.doc.defaultView?.confirm(m) ?? true);
    return ask(`${what} Your edits since the last save will be replaced (undo can bring them back).`);
  }

  private async openFile(input: HTMLInputElement): Promise<void> {
    const picker = openPickerOf(this.doc.defaultView);
    if (!picker) return input.click();
    const handle = await pickTuningFile(picker);
    if (handle) this.loadText(await (await handle.getFile()).text(), handle.name, handle);
  }

  private loadIntoA(text: string, name: string): void {
    const r = readTuningText(text);
    if (!r.ok) return this.file.show(`${name}: not loaded into A (${r.problems.length} problems).`, r.problems);
    this.session.setA(serializeTuning(r.tuning), name);
    this.compare.setAName(name);
    this.afterChange();
    this.notice.say(`A is now ${name}; press ${this.host.compareKey ?? '`'} to hear it.`);
  }

  private restoreVersion(index: number): void {
    const v = readAutosaveVersions(this.host.storage)[index];
    if (v && this.ask('Restore the autosaved version?')) this.setWorking(v.text, 'restore an autosaved version');
  }

  private versionLabels(): string[] {
    return readAutosaveVersions(this.host.storage).map((v, i) => `${i === 0 ? 'newest' : `${i} back`} · ${new Date(v.savedAt).toLocaleTimeString()}`);
  }

  private onKey(e: KeyboardEvent): void {
    const action = editorKeyAction(e, this.host.compareKey ?? '`');
    if (!action) return;
    e.preventDefault();
    if (action === 'undo') this.undo();
    else if (action === 'redo') this.redo();
    else this.listenTo(this.session.side === 'A' ? 'B' : 'A');
  }

  private applyVolume(): void {
    if (!this.host.master) return;
    this.host.master.gain.setTargetAtTime(listeningGain(this.volume.db), this.host.ralenti.context.currentTime, 0.02);
  }

  private switchPath(): void {
    this.builtin?.switched();
    this.readouts.setPath(this.path.mode);
  }
}
