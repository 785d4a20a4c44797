// Public entry of the editor (`ralenti/editor`, for development builds): mountEditor for any page, the panel, its
// curve blade and tuning-file helpers.
export { mountEditor, type MountEditorOptions, type MountedEditor } from './mount-editor';
export { EditorPanel } from './editor-panel';
export type { EditorHost } from './editor-host';
export { PlaybackPath } from './playback-path';
export { EditorDock, editorDockDefaults } from './editor-dock';
export { VoiceNames, type NamedVoice } from './voice-names';
export { LISTENING_FLOOR_DB, listeningGain } from './listening-level';
export { BuiltinRatePlayer, type ComparisonSource } from './builtin-rate-player';
export { AUTOSAVE_KEY, DOWNLOAD_NAME, loadAutosaved, autosave, clearAutosave, readTuningText, downloadJson, type TuningProblem } from './tuning-store';
export { AUTOSAVE_VERSIONS_KEY, readAutosaveVersions } from './autosave-versions';
export { decodeDroppedFile, type DecodedAudioFile } from './decode-audio-file';
export { dropSound, type ReplaceSound } from './sound-drop';
export { groupPageParts, type GroupPagePart, type GroupPageArgs } from './sections/group-section';
export type { MutableGroup } from './tuning-store';
export { CurveBladePlugin, curveBladeBundle, CurveBladeApi, addCurveBlade, type CurveBladeParams, type BladeParent } from './curve-blade';
export { ElementBladePlugin, elementBladeBundle } from './element-blade';
export { RecordingSection, type RecordingControls, type RecordingState, type ScriptProblem } from './sections/recording-section';
