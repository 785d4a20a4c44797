// The tuning editor: a tweakpane panel over a running Ralenti, editing a draft tuning that is applied live.
import { Pane } from 'tweakpane';
import type { Ralenti, RalentiAudioError } from '../runtime';
import { defaultTuning } from '../runtime';
import { gainToDb, type Tuning } from '../src';
import { curveBladeBundle, type CurveBladeApi } from './curve-blade';
import { elementBladeBundle } from './element-blade';
import { BuiltinRatePlayer, type ComparisonSource } from './builtin-rate-player';
import { addCompareSection, FileSection } from './sections/file-section';
import { ReadoutsSection, type NamedVoice } from './sections/readouts-section';
import { RecordingSection, type RecordingControls } from './sections/recording-section';
import { addDopplerSection, addGroupsSection, addListeningSection, addTimeFlowSection, type TunableContext } from './sections/tunable-sections';
import { autosave, downloadTuning, editableCopy, readTuningText, type MutableTuning, type TuningProblem } from './tuning-store';
import { editorCss } from './editor-style';
import { listeningGain } from './listening-level';

/** What the editor needs from the host page. */
export interface EditorHost {
  ralenti: Ralenti;
  /** Element the panel lives in. */
  container: HTMLElement;
  /** Master bus: the engine path and the comparison path both feed it; the spectrum taps it. */
  master: GainNode;
  /** Gain node between the engine output and the master bus (the A/B switch mutes it). */
  engineBus: GainNode;
  /** Voices shown in the readouts. */
  voices: readonly NamedVoice[];
  /** Sources the built-in comparison path mirrors. */
  comparison: readonly ComparisonSource[];
  /** Storage for the autosave (localStorage); undefined disables it. */
  storage?: Storage;
  /** Problems found in the autosaved tuning at start, shown in the file section. */
  restoreProblems?: readonly TuningProblem[];
  /** Whether the running tuning came from the autosave. */
  restored?: boolean;
  /** Fly-through recording and replay; the "Fly-through recording" section appears when given. */
  recording?: RecordingControls;
}

/** The editor panel; call update() once per animation frame. */
export class EditorPanel {
  /** Problems of the last tuning load (empty after a good load). */
  lastProblems: readonly TuningProblem[] = [];
  /** The live listening volume in dB (master bus). */
  readonly volume = { db: -18 };
  /** Which path plays: the engine, or the browser's built-in playbackRate (A/B). */
  readonly path: { mode: 'engine' | 'builtin' } = { mode: 'engine' };
  private readonly host: EditorHost;
  private readonly doc: Document;
  private readonly builtin: BuiltinRatePlayer;
  private readonly autosaveState = { enabled: true };
  private readonly live = { timeScale: 1 };
  private pane!: Pane;
  private draft!: MutableTuning;
  private curves: CurveBladeApi[] = [];
  private readouts!: ReadoutsSection;
  private file!: FileSection;
  private recording: RecordingSection | null = null;
  private saveTimer: ReturnType<typeof setTimeout> | null = null;
  /** The latest error the audio thread reported, shown in the readouts (null: none yet). */
  private lastAudioError: RalentiAudioError | null = null;
  private readonly stopErrors: () => void;

  constructor(host: EditorHost) {
    this.host = host;
    this.doc = host.container.ownerDocument;
    if (!this.doc.getElementById('ralenti-editor-css')) {
      const style = this.doc.createElement('style');
      style.id = 'ralenti-editor-css';
      style.textContent = editorCss;
      this.doc.head.appendChild(style);
    }
    this.volume.db = Math.round(gainToDb(Math.max(1e-6, host.master.gain.value)));
    this.stopErrors = host.ralenti.onError((e) => (this.lastAudioError = e));
    this.builtin = new BuiltinRatePlayer({ context: host.ralenti.context, output: host.master, sources: host.comparison });
    this.build();
    if (host.restoreProblems?.length) this.file.show('The autosaved tuning did not load; the built-in tuning runs.', host.restoreProblems);
    else if (host.restored) this.file.show('Restored the autosaved tuning.');
  }

  /** The running tuning (as the runtime validated it). */
  get tuning(): Tuning {
    return this.host.ralenti.tuning;
  }

  /** Loads tuning text as if from a file: applies it, or lists its problems and leaves the running tuning unchanged. */
  loadText(text: string, fileName = 'tuning'): boolean {
    const r = readTuningText(text);
    if (!r.ok) {
      this.lastProblems = r.problems;
      this.file.show(`${fileName}: not loaded (${r.problems.length} problem${r.problems.length === 1 ? '' : 's'}); the running tuning is unchanged.`, r.problems);
      return false;
    }
    this.host.ralenti.setTuning(r.json);
    this.lastProblems = [];
    this.rebuild();
    this.save();
    this.file.show(`${fileName}: loaded.`);
    return true;
  }

  /** Per-frame update: curve markers, readouts, the comparison path. */
  update(): void {
    const ralenti = this.host.ralenti;
    const s = ralenti.timeScale;
    this.live.timeScale = s;
    for (const c of this.curves) if (c.marker !== s) c.marker = s;
    this.readouts.update({ stats: ralenti.stats, monitors: ralenti.voices, capacity: ralenti.capacity, lastError: this.lastAudioError, load: ralenti.renderLoad });
    this.builtin.update(ralenti.voices, ralenti.tuning);
    this.recording?.update();
  }

  /** Removes the panel. */
  dispose(): void {
    this.stopErrors();
    this.builtin.stop();
    this.pane.dispose();
    this.file.input.remove();
    this.recording?.dispose();
  }

  private build(): void {
    this.draft = editableCopy(this.host.ralenti.tuning);
    this.curves = [];
    this.pane = new Pane({ container: this.host.container, title: 'Ralenti tuning' });
    this.pane.registerPlugin(curveBladeBundle);
    this.pane.registerPlugin(elementBladeBundle);
    const ctx: TunableContext = { draft: this.draft, curves: this.curves, changed: (last) => this.apply(last) };
    addTimeFlowSection(this.pane, ctx, this.live);
    addGroupsSection(this.pane, ctx);
    addDopplerSection(this.pane, ctx);
    this.readouts = new ReadoutsSection(this.pane, this.doc, this.host.ralenti.context, this.host.voices);
    this.host.master.connect(this.readouts.spectrum.analyser);
    addCompareSection(this.pane, this.draft, this.path, (last) => this.apply(last), () => this.switchPath());
    this.file = new FileSection(this.pane, this.doc, {
      download: () => downloadTuning(this.doc, this.host.ralenti.tuning),
      loadText: (text, name) => this.loadText(text, name),
      reset: () => {
        this.host.ralenti.setTuning(JSON.parse(JSON.stringify(defaultTuning)));
        this.rebuild();
        this.save();
        this.file.show('Reset to the built-in tuning.');
      },
      autosave: this.autosaveState,
      autosaveChanged: () => this.save(),
    });
    this.recording = this.host.recording ? new RecordingSection(this.pane, this.doc, this.host.recording) : null;
    addListeningSection(this.pane, ctx, this.volume, () => this.applyVolume());
    this.pane.element.classList.add('rl-pane');
  }

  private rebuild(): void {
    try {
      this.host.master.disconnect(this.readouts.spectrum.analyser);
    } catch {
      // Not connected.
    }
    this.file.input.remove();
    this.recording?.dispose();
    this.pane.dispose();
    this.build();
  }

  private apply(last: boolean): void {
    try {
      this.host.ralenti.setTuning(this.draft);
    } catch (err) {
      const issues = (err as { issues?: TuningProblem[] }).issues ?? [{ path: '', message: String(err) }];
      this.file.show('That edit was refused; the running tuning is unchanged.', issues);
      return;
    }
    if (last) this.save();
    else this.scheduleSave();
  }

  private scheduleSave(): void {
    if (this.saveTimer !== null) clearTimeout(this.saveTimer);
    this.saveTimer = setTimeout(() => this.save(), 400);
  }

  private save(): void {
    if (this.saveTimer !== null) clearTimeout(this.saveTimer);
    this.saveTimer = null;
    if (this.autosaveState.enabled) autosave(this.host.storage, this.host.ralenti.tuning);
  }

  private applyVolume(): void {
    const t = this.host.ralenti.context.currentTime;
    this.host.master.gain.setTargetAtTime(listeningGain(this.volume.db), t, 0.02);
  }

  private switchPath(): void {
    const t = this.host.ralenti.context.currentTime;
    const builtin = this.path.mode === 'builtin';
    if (builtin) this.builtin.start();
    this.host.engineBus.gain.setTargetAtTime(builtin ? 0 : 1, t, 0.02);
    if (!builtin) setTimeout(() => this.builtin.stop(), 150);
  }
}
