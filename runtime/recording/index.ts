// Public names of runtime/recording: record a fly-through in the page as a scene script, and replay a script.
export { FlyThroughRecorder, flyThroughRecorderDefaults, formatSceneScript } from './fly-through-recorder';
export type { FlyThroughRecorderOptions, RecordedVoice, ScriptContent } from './fly-through-recorder';
export { SceneReplay, readSceneScriptText } from './scene-replay';
export type { ReplayPoint, SceneScriptReadResult } from './scene-replay';
export { AudioCapture, audioCaptureDefaults } from './audio-capture';
export type { AudioCaptureOptions, CapturedAudio } from './audio-capture';
export { CAPTURE_PROCESSOR_NAME } from './capture-protocol';
