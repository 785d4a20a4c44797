// Public entry of the Node offline renderer: scene scripts, WAV files and renderScene.
export { renderScene, loadScene, loadSceneFile } from './render-scene';
export type { RenderSceneOptions, LoadedScene } from './render-scene';
export { renderLoadedScene, sceneSourceIds, SCENE_BLOCK_FRAMES } from './scene-renderer';
export type { SceneRenderOptions, SceneRenderResult, SceneRenderStats } from './scene-renderer';
export { parseSceneScript, SCENE_SCRIPT_VERSION } from './parse-scene-script';
export { ScriptError } from './script-error';
export type { ScriptIssue } from './script-error';
export { evaluateMotion } from './scene-motion';
export { generateSound } from './scene-sounds';
export type { SoundBuffer } from './scene-sounds';
export type * from './scene-types';
export { readWav, writeWav, WavError } from './wav';
export type { WavAudio, WavEncoding } from './wav';
export { parseWavLayout, wavHeader, bytesPerSampleOf, checkWavRate, WAV_RATE_RANGE } from './wav-format';
export type { WavLayout } from './wav-format';
export { decodeFrames, encodeFrames, TpdfDither, WAV_SAMPLE_BOUND } from './wav-samples';
export type { SampleCounts } from './wav-samples';
