// "Fly-through recording" section: start/stop a recording, download it as a scene script, load a script, replay it.
import type { ButtonApi, FolderApi, Pane } from 'tweakpane';
import { createJsonFileInput } from './json-file-input';
import { problemList } from './problem-list';

/** One problem of a loaded scene script: JSON path ('' = the document) and message. */
export interface ScriptProblem {
  path: string;
  message: string;
}

/** What the section shows; the host keeps it current and the section reads it every frame. */
export interface RecordingState {
  recording: boolean;
  replaying: boolean;
  /** Whether there is a recorded or loaded script to download or replay. */
  hasScript: boolean;
  /** Status line, e.g. "Recording… 3.2 s". */
  message: string;
  /** Problems of the last loaded script (empty when it loaded). */
  problems: readonly ScriptProblem[];
  /** Whether audio captured with the last recording can be downloaded (hosts without capture leave it out). */
  hasAudio?: boolean;
}

/** The host's side of the section (the sample scene implements it). */
export interface RecordingControls {
  readonly state: RecordingState;
  toggleRecording(): void;
  toggleReplay(): void;
  download(): void;
  /** Offers the audio captured with the last recording as a WAV file (hosts without capture leave it out). */
  downloadAudio?(): void;
  loadText(text: string, fileName: string): void;
}

const css = `
.rl-rec-status { font: 11px/1.4 sans-serif; color: #d9dee8; min-height: 14px; }
.rl-rec-status.rl-rec-live { color: #ff8f7a; }
.rl-rec-bad { color: #ff9b8a; }
.rl-rec-problems { margin: 3px 0 0; padding-left: 16px; color: #ffd0c7; }
.rl-rec-problems code { color: #ffe08a; }
`;

/** The section; call update() once per frame. */
export class RecordingSection {
  readonly folder: FolderApi;
  /** The hidden file input for scene scripts (tests set files on it directly). */
  readonly input: HTMLInputElement;
  private readonly controls: RecordingControls;
  private readonly doc: Document;
  private readonly record: ButtonApi;
  private readonly replay: ButtonApi;
  private readonly download: ButtonApi;
  private readonly downloadAudio: ButtonApi | null;
  private readonly status: HTMLDivElement;
  private shown = '';

  constructor(pane: Pane, doc: Document, controls: RecordingControls) {
    this.controls = controls;
    this.doc = doc;
    if (!doc.getElementById('ralenti-recording-css')) {
      const style = doc.createElement('style');
      style.id = 'ralenti-recording-css';
      style.textContent = css;
      doc.head.appendChild(style);
    }
    this.folder = pane.addFolder({ title: 'Fly-through recording' });
    this.record = this.folder.addButton({ title: 'Start recording' });
    this.record.element.title = 'Record the camera and source paths with the time scale, as a scene script the checker and renderer read.';
    this.record.on('click', () => controls.toggleRecording());
    this.status = doc.createElement('div');
    this.status.className = 'rl-rec-status';
    this.status.setAttribute('role', 'status');
    this.folder.addBlade({ view: 'ralenti-element', element: this.status });
    this.download = this.folder.addButton({ title: 'Download scene script (.json)' });
    this.download.element.title = 'Download the last recording as a scene script (JSON).';
    this.download.on('click', () => controls.download());
    this.downloadAudio = controls.downloadAudio ? this.folder.addButton({ title: 'Download recorded audio (.wav)' }) : null;
    this.downloadAudio?.on('click', () => controls.downloadAudio?.());
    this.input = createJsonFileInput(doc, 'ralenti-scene-file', (text, name) => controls.loadText(text, name));
    const load = this.folder.addButton({ title: 'Load scene script…' });
    load.element.title = 'Load a recorded scene script (JSON) to replay it.';
    load.on('click', () => this.input.click());
    this.replay = this.folder.addButton({ title: 'Replay' });
    this.replay.element.title = 'Replay the recorded or loaded script in the scene (the camera follows it).';
    this.replay.on('click', () => controls.toggleReplay());
    this.update();
  }

  /** Refreshes the buttons and the status line from the host's state (touches the DOM only on change). */
  update(): void {
    const s = this.controls.state;
    const key = `${s.recording}|${s.replaying}|${s.hasScript}|${s.hasAudio === true}|${s.message}|${s.problems.length}`;
    if (key === this.shown) return;
    this.shown = key;
    this.record.title = s.recording ? 'Stop recording' : 'Start recording';
    this.record.disabled = s.replaying;
    this.replay.title = s.replaying ? 'Stop replay' : 'Replay';
    this.replay.disabled = s.recording || !s.hasScript;
    this.download.disabled = s.recording || !s.hasScript;
    if (this.downloadAudio) this.downloadAudio.disabled = s.recording || s.hasAudio !== true;
    this.status.classList.toggle('rl-rec-live', s.recording || s.replaying);
    this.status.replaceChildren();
    const line = this.doc.createElement('div');
    if (s.problems.length) line.className = 'rl-rec-bad';
    line.textContent = s.message;
    this.status.appendChild(line);
    if (!s.problems.length) return;
    this.status.appendChild(problemList(this.doc, s.problems, 'rl-rec-problems'));
  }

  /** Removes the hidden file input (the pane disposes the folder). */
  dispose(): void {
    this.input.remove();
  }
}
