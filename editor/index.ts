// Public entry of the editor: the tuning panel, its curve blade and tuning-file helpers.
export { EditorPanel, type EditorHost } from './editor-panel';
export { LISTENING_FLOOR_DB, listeningGain } from './listening-level';
export { BuiltinRatePlayer, type ComparisonSource } from './builtin-rate-player';
export type { NamedVoice } from './sections/readouts-section';
export { AUTOSAVE_KEY, DOWNLOAD_NAME, loadAutosaved, autosave, clearAutosave, readTuningText, downloadJson, type TuningProblem } from './tuning-store';
export { CurveBladePlugin, curveBladeBundle, CurveBladeApi } from './curve-blade';
export { ElementBladePlugin, elementBladeBundle } from './element-blade';
export { RecordingSection, type RecordingControls, type RecordingState, type ScriptProblem } from './sections/recording-section';
