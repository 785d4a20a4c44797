// What the editor needs from the page it runs in: the runtime and an element, plus optional extras.
import type { Ralenti } from '../runtime';
import type { ComparisonSource } from './builtin-rate-player';
import type { RecordingControls } from './sections/recording-section';
import type { ReplaceSound } from './sound-drop';
import type { TuningProblem } from './tuning-store';
import type { NamedVoice, VoiceNames } from './voice-names';

/** What the editor needs from the host page (only `ralenti` and `container` are required). */
export interface EditorHost {
  ralenti: Ralenti;
  /** Element the panel lives in (it scrolls when taller than the page). */
  container: HTMLElement;
  /** Listening gain after the engine: the volume control drives it (absent: no volume control). */
  master?: GainNode;
  /** Gain between the engine and `master`, muted when the browser's playbackRate path plays (needs `comparison`). */
  engineBus?: GainNode;
  /** Names for the readouts (voices and sources); `voices` is the older way to name voices. */
  names?: VoiceNames;
  voices?: readonly NamedVoice[];
  /** Sources the browser playbackRate comparison mirrors (with `engineBus` and `master`). */
  comparison?: readonly ComparisonSource[];
  /** Storage for the autosave (localStorage); undefined disables it. */
  storage?: Storage;
  /** Problems found in the autosaved tuning at start, shown in the file section. */
  restoreProblems?: readonly TuningProblem[];
  /** Whether the running tuning came from the autosave. */
  restored?: boolean;
  /** Fly-through recording and replay; the "Fly-through recording" section appears when given. */
  recording?: RecordingControls;
  /** Asks before replacing unsaved edits (default: window.confirm). */
  confirm?: (message: string) => boolean;
  /** Replaces a voice's sound with a dropped file (the page decides how); absent: drops are refused. */
  replaceSound?: ReplaceSound;
  /** Key (KeyboardEvent.key) that toggles A/B; default '`'. */
  compareKey?: string;
}
