// window.ralentiScene: a small read-only inspection handle for tests and curious visitors.
import { centsToRatio, type EngineStats, type VoiceMonitor } from '../src';
import type { EditorPanel, TuningProblem } from '../editor';
import type { RenderLoad } from '../runtime';
import type { SceneAudio } from './scene-audio';
import type { FlyThroughSummary } from './fly-through';

/** One voice as the handle reports it: the runtime's monitor plus the scene's name and the ratio. */
export interface InspectedVoice extends VoiceMonitor {
  name: string;
  /** Playback ratio (2^(ratioCents/1200)). */
  ratio: number;
}

/** Shape of window.ralentiScene (all members read-only; values are fresh copies). */
export interface RalentiSceneHandle {
  readonly ready: boolean;
  readonly error: string | null;
  readonly timeScale: number;
  readonly slowMotion: boolean;
  readonly gameTime: number;
  readonly stats: EngineStats | null;
  /** Render load measured in the worklet (share of audio time spent in process(), and the clock), or null. */
  readonly load: RenderLoad | null;
  readonly voices: InspectedVoice[];
  /** The running tuning as JSON text (serializeTuning). */
  readonly tuningJson: string | null;
  readonly lastLoadProblems: TuningProblem[];
  readonly playbackPath: 'engine' | 'builtin';
  /** The editor's session: which tuning plays (A/B), unsaved edits, undo/redo, the last notice; null before audio. */
  readonly editor: { side: 'A' | 'B'; dirty: boolean; canUndo: boolean; canRedo: boolean; notice: string; autosave: string; autosavePending: boolean; savedText: string } | null;
  /** Fly-through recording and replay state plus the camera position (m), or null before audio starts. */
  readonly flyThrough: (FlyThroughSummary & { listener: { x: number; y: number; z: number } }) | null;
}

/** Live state the handle reads from. */
export interface SceneState {
  audio: SceneAudio | null;
  error: string | null;
  slowMotion: boolean;
  gameTime: number;
  tuningJson: () => string | null;
  lastLoadProblems: () => TuningProblem[];
  playbackPath: () => 'engine' | 'builtin';
  editor: () => EditorPanel | null;
  flyThrough: () => (FlyThroughSummary & { listener: { x: number; y: number; z: number } }) | null;
}

/** Installs window.ralentiScene over `state`. */
export function installSceneHandle(state: SceneState): RalentiSceneHandle {
  const handle: RalentiSceneHandle = Object.freeze({
    get ready() {
      return state.audio !== null;
    },
    get error() {
      return state.error;
    },
    get timeScale() {
      return state.audio ? state.audio.ralenti.timeScale : 1;
    },
    get slowMotion() {
      return state.slowMotion;
    },
    get gameTime() {
      return state.gameTime;
    },
    get stats() {
      return state.audio ? { ...state.audio.ralenti.stats } : null;
    },
    get load() {
      const l = state.audio?.ralenti.renderLoad;
      return l ? { ...l } : null;
    },
    get voices() {
      const a = state.audio;
      if (!a) return [];
      return a.ralenti.voices.map((v) => ({ ...v, name: a.voiceNames.get(v.voice) ?? v.group, ratio: centsToRatio(v.ratioCents) }));
    },
    get tuningJson() {
      return state.tuningJson();
    },
    get lastLoadProblems() {
      return state.lastLoadProblems().map((p) => ({ ...p }));
    },
    get playbackPath() {
      return state.playbackPath();
    },
    get editor() {
      const p = state.editor();
      if (!p) return null;
      const s = p.session;
      return { side: s.side, dirty: s.dirty, canUndo: s.history.canUndo, canRedo: s.history.canRedo, notice: p.notice.last, autosave: s.lastAutosave, autosavePending: s.autosavePending, savedText: s.saved };
    },
    get flyThrough() {
      return state.flyThrough();
    },
  });
  Object.defineProperty(window, 'ralentiScene', { value: handle, writable: false, configurable: false, enumerable: true });
  return handle;
}
