// Fly-through recording for the sample scene: records the camera, the moving bodies and the slow-motion requests,
// offers the recording as a scene script (with hums like the scene's sounds and the running tuning), loads scripts
// and replays them; the panel's "Fly-through recording" section drives it.
import type { Easing, Vec3Like } from '../src';
import { serializeTuning, type Ralenti } from '../runtime';
import { AudioCapture, FlyThroughRecorder, formatSceneScript, readSceneScriptText, SceneReplay } from '../runtime/recording';
import { writeWav } from '../runtime/offline/wav';
import type { SceneScript } from '../runtime/offline/scene-types';
import { downloadJson, type RecordingControls, type RecordingState } from '../editor';
import { SCRIPT_SOUNDS, SCRIPT_VOICES } from './script-sounds';

/** File name offered for recorded scripts. */
export const FLY_THROUGH_FILE_NAME = 'ralenti-flythrough.json';
/** File name offered for the audio captured with a recording (judge it with `ralenti check script.json --audio file.wav`). */
export const FLY_THROUGH_AUDIO_FILE_NAME = 'ralenti-flythrough.wav';

/** What the fly-through needs from the scene. */
export interface FlyThroughOptions {
  ralenti: Ralenti;
  doc: Document;
  /** The time scale the player asks for outside replays (1, or the slow-motion target). */
  wantedTimeScale: () => number;
  /** The listener's orientation now (unit vectors). */
  orientation: () => { forward: Vec3Like; up: Vec3Like };
  /**
   * Page clock in seconds (default performance.now() / 1000), the clock of the animation-frame timestamps passed to
   * advance() and record(): recordings are timestamped by it and replays advance by it, so a slow frame rate does not
   * stretch or squeeze them (the audio heard runs in real time too).
   */
  clock?: () => number;
}

/** Read-only summary for the inspection handle. */
export interface FlyThroughSummary {
  recording: boolean;
  replaying: boolean;
  /** Seconds recorded (running or last recording). */
  seconds: number;
  frames: number;
  /** Replay clock in seconds (0 when not replaying). */
  replayTime: number;
  /** Duration of the recorded or loaded script, s (0 without one). */
  scriptSeconds: number;
}

/** Recording and replay state of the scene; main.ts calls frame() once per animation frame. */
export class FlyThrough implements RecordingControls {
  readonly state: RecordingState = { recording: false, replaying: false, hasScript: false, message: 'Start recording, fly past a source (Space for slow motion), then stop.', problems: [] };
  private readonly options: FlyThroughOptions;
  private readonly recorder = new FlyThroughRecorder();
  private readonly clock: () => number;
  private lastAdvance: number | null = null;
  private script: { text: string; parsed: SceneScript } | null = null;
  private run: SceneReplay | null = null;
  private capture: AudioCapture | null = null;
  private audio: Uint8Array | null = null;

  constructor(options: FlyThroughOptions) {
    this.options = options;
    this.clock = options.clock ?? (() => performance.now() / 1000);
  }

  /** The running replay (the scene moves the camera and bodies from it), or null. */
  get replay(): SceneReplay | null {
    return this.run;
  }

  /** Summary for window.ralentiScene. */
  get summary(): FlyThroughSummary {
    return {
      recording: this.recorder.recording,
      replaying: this.run !== null,
      seconds: this.recorder.seconds,
      frames: this.recorder.frameCount,
      replayTime: this.run?.time ?? 0,
      scriptSeconds: this.script?.parsed.duration ?? 0,
    };
  }

  /** Advances a running replay to the frame's timestamp `time` (s, page clock; call before placing the bodies). */
  advance(time: number): void {
    const run = this.run;
    if (!run) return;
    const now = time;
    const dt = this.lastAdvance === null ? 0 : Math.max(0, now - this.lastAdvance);
    this.lastAdvance = now;
    for (const k of run.advance(dt)) this.options.ralenti.setTimeScale(k.target, { ramp: k.rampSeconds, easing: k.easing });
    this.state.message = `Replaying ${run.time.toFixed(1)} / ${run.script.duration.toFixed(1)} s`;
    if (run.finished) this.endReplay('Replay finished.');
  }

  /**
   * Records the listener and bodies (positions in m) at the frame's timestamp `time` (s, page clock) while a recording
   * runs (call after placing them). The frame timestamp, not the time of the call, matches the frame's movement.
   */
  record(time: number, listener: Vec3Like, sources: Readonly<Record<string, Vec3Like>>): void {
    if (!this.recorder.recording) return;
    this.recorder.frame(time, listener, sources);
    this.state.message = `Recording… ${this.recorder.seconds.toFixed(1)} s`;
  }

  /** Notes a time-scale request the scene made (recorded when a recording runs). */
  timeScaleRequested(target: number, rampSeconds: number, easing: Easing): void {
    this.recorder.timeScale(this.clock(), target, rampSeconds, easing);
  }

  /** Starts or stops a recording. */
  toggleRecording(): void {
    if (this.run) return;
    if (!this.recorder.recording) {
      this.recorder.start(this.clock(), this.options.orientation(), this.options.ralenti.timeScale);
      this.startCapture();
      this.state.recording = true;
      this.state.problems = [];
      this.state.message = 'Recording… 0.0 s';
      return;
    }
    this.recorder.stop(this.clock());
    this.state.recording = false;
    const capture = this.capture;
    this.capture = null;
    if (this.recorder.frameCount < 2) {
      void capture?.stop(0);
      this.state.message = 'Nothing recorded (too short).';
      return;
    }
    if (capture) void this.finishCapture(capture, this.recorder.startPageTime, this.recorder.seconds);
    const json = this.recorder.toScript({
      title: `Fly-through recorded in the sample scene (${this.recorder.seconds.toFixed(1)} s); hums stand in for its sounds`,
      tuning: JSON.parse(serializeTuning(this.options.ralenti.tuning)),
      sounds: SCRIPT_SOUNDS,
      voices: SCRIPT_VOICES,
    });
    this.setScript(formatSceneScript(json));
    this.state.message = `Recorded ${this.recorder.seconds.toFixed(1)} s (${this.recorder.frameCount} frames): download or replay it.`;
  }

  /** Taps the engine's output on the audio thread while a recording runs (the page plays on). */
  private startCapture(): void {
    this.audio = null;
    this.state.hasAudio = false;
    const r = this.options.ralenti;
    if (typeof AudioWorkletNode === 'undefined' || !('audioWorklet' in r.context)) return;
    try {
      this.capture = new AudioCapture(r.context, r.node);
      this.capture.start(this.clock());
    } catch (e) {
      this.capture = null;
      console.warn(`audio capture unavailable: ${(e as Error).message}`);
    }
  }

  private async finishCapture(capture: AudioCapture, from: number, seconds: number): Promise<void> {
    const got = await capture.stop(from);
    const frames = Math.min(got.channels[0].length, Math.round(seconds * got.sampleRate));
    this.audio = writeWav({ sampleRate: got.sampleRate, channels: got.channels.map((c) => c.subarray(0, frames)), encoding: 'float32' });
    this.state.hasAudio = true;
    if (got.droppedFrames > 0) this.state.message += ` (${got.droppedFrames} audio frames could not be captured)`;
  }

  /** Offers the audio the engine played during the last recording as a WAV file. */
  downloadAudio(): void {
    if (!this.audio) return;
    const url = URL.createObjectURL(new Blob([this.audio as Uint8Array<ArrayBuffer>], { type: 'audio/wav' }));
    const a = this.options.doc.createElement('a');
    a.href = url;
    a.download = FLY_THROUGH_AUDIO_FILE_NAME;
    a.style.display = 'none';
    this.options.doc.body.appendChild(a);
    a.click();
    a.remove();
    setTimeout(() => URL.revokeObjectURL(url), 1000);
  }

  /** Starts or stops replaying the recorded or loaded script. */
  toggleReplay(): void {
    if (this.run) {
      this.endReplay('Replay stopped.');
      return;
    }
    if (!this.script || this.recorder.recording) return;
    this.run = new SceneReplay({ script: this.script.parsed });
    this.lastAdvance = null;
    this.state.replaying = true;
    this.options.ralenti.setTimeScale(1, { ramp: 0 });
    for (const k of this.run.advance(0)) this.options.ralenti.setTimeScale(k.target, { ramp: k.rampSeconds, easing: k.easing });
  }

  /** Offers the recorded or loaded script as a download. */
  download(): void {
    if (!this.script) return;
    downloadJson(this.options.doc, this.script.text, FLY_THROUGH_FILE_NAME);
  }

  /** Loads a scene script; on problems lists them by JSON path and keeps the current script. */
  loadText(text: string, fileName: string): void {
    if (this.recorder.recording || this.run) return;
    const r = readSceneScriptText(text);
    if (!r.ok) {
      this.state.problems = r.problems;
      this.state.message = `${fileName}: not loaded (${r.problems.length} problem${r.problems.length === 1 ? '' : 's'}).`;
      return;
    }
    this.setScript(text);
    this.state.problems = [];
    this.state.message = `${fileName}: loaded (${r.script.duration.toFixed(1)} s, ${Object.keys(r.script.sources).length} sources): press Replay.`;
  }

  private setScript(text: string): void {
    const r = readSceneScriptText(text);
    if (!r.ok) throw new Error(`recorded script does not parse: ${r.problems.map((p) => `${p.path}: ${p.message}`).join('; ')}`);
    this.script = { text, parsed: r.script };
    this.state.hasScript = true;
  }

  private endReplay(message: string): void {
    this.run = null;
    this.state.replaying = false;
    this.state.message = message;
    this.options.ralenti.setTimeScale(this.options.wantedTimeScale());
  }
}
