// Sample scene entry: the night test range, fly camera, slow motion on Space, and the tuning panel once audio starts.
import * as THREE from 'three';
import { serializeTuning, type RalentiSource } from '../runtime';
import { EditorPanel } from '../editor';
import { dronePosition, GENERATOR_POSITION, kartHeading, kartPosition, orbPosition } from './actor-paths';
import { FlyCamera, isTyping } from './fly-camera';
import { showHelp } from './help-text';
import { startSceneAudio, type SceneAudio } from './scene-audio';
import { installSceneHandle, type SceneState } from './scene-handle';
import { showStartOverlay } from './start-overlay';
import { createTestRange } from './test-range';

const rangeHost = document.getElementById('range') as HTMLElement;
const panelHost = document.getElementById('panel') as HTMLElement;
const hud = document.getElementById('hud') as HTMLElement;
const range = createTestRange(rangeHost);
const fly = new FlyCamera({ camera: range.camera, element: range.renderer.domElement });
fly.lookAt(-4, 0, -26);
fly.setEnabled(false);
showHelp(document.getElementById('help') as HTMLElement);

let panel: EditorPanel | null = null;
const state: SceneState = {
  audio: null,
  error: null,
  slowMotion: false,
  gameTime: 0,
  tuningJson: () => (state.audio ? serializeTuning(state.audio.ralenti.tuning) : null),
  lastLoadProblems: () => (panel ? [...panel.lastProblems] : []),
  playbackPath: () => panel?.path.mode ?? 'engine',
};
installSceneHandle(state);

function resize(): void {
  range.resize(rangeHost.clientWidth, rangeHost.clientHeight);
}
window.addEventListener('resize', resize);
resize();

// Slow motion: hold Space (ramp in with the tuning's ramp, release to leave), or T to toggle.
let held = false;
let toggled = false;
function applySlowMotion(): void {
  const want = held || toggled;
  if (want === state.slowMotion) return;
  state.slowMotion = want;
  const a = state.audio;
  if (a) a.ralenti.setTimeScale(want ? a.ralenti.tuning.timeFlow.slowMotionScale : 1);
}
window.addEventListener('keydown', (e) => {
  if (isTyping(e)) return;
  if (e.code === 'Space') {
    e.preventDefault();
    if (!e.repeat) (held = true), applySlowMotion();
  } else if (e.code === 'KeyT' && !e.repeat) {
    toggled = !toggled;
    applySlowMotion();
  } else if (e.code === 'KeyC' && !e.repeat) state.audio?.playClick();
});
window.addEventListener('keyup', (e) => {
  if (e.code === 'Space') (held = false), applySlowMotion();
});
window.addEventListener('blur', () => {
  held = false;
  applySlowMotion();
});

const camRight = new THREE.Vector3();
const toSource = new THREE.Vector3();
function panOf(source: RalentiSource | null): number {
  if (!source) return 0;
  const p = source.position;
  toSource.set(p.x, p.y, p.z).sub(range.camera.position);
  const d = toSource.length();
  if (d < 1e-6) return 0;
  camRight.set(1, 0, 0).applyQuaternion(range.camera.quaternion);
  return toSource.dot(camRight) / d;
}

const overlay = showStartOverlay(document.getElementById('overlay') as HTMLElement, -18);
overlay.started.then(async (volumeDb) => {
  let audio: SceneAudio;
  try {
    audio = await startSceneAudio(volumeDb, window.localStorage, panOf);
  } catch (err) {
    state.error = String((err as Error)?.message ?? err);
    overlay.fail(`Audio could not start: ${state.error}`);
    return;
  }
  panel = new EditorPanel({
    ralenti: audio.ralenti,
    container: panelHost,
    master: audio.master,
    engineBus: audio.engineBus,
    voices: audio.voices,
    comparison: audio.comparison,
    storage: window.localStorage,
    restored: audio.restored,
    restoreProblems: audio.restoreProblems,
  });
  audio.ralenti.onError((e) => console.warn(`ralenti audio thread: ${e.message}`));
  state.audio = audio;
  if (state.slowMotion) audio.ralenti.setTimeScale(audio.ralenti.tuning.timeFlow.slowMotionScale);
  overlay.hide();
  fly.setEnabled(true);
});

// Interface clicks every 2 s of wall-clock time (exempt group: their rhythm and pitch ignore slow motion).
let nextClick = 2;
const forward = new THREE.Vector3();
const up = new THREE.Vector3();
const tmp = { x: 0, y: 0, z: 0 };
const listenerState = { position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } };
let wall = 0;
let lastMs = performance.now();

function setBody(obj: THREE.Object3D, source: RalentiSource | undefined, p: { x: number; y: number; z: number }): void {
  obj.position.set(p.x, p.y, p.z);
  source?.setPosition(p.x, p.y, p.z);
}

function frame(ms: number): void {
  const dt = Math.min(0.1, Math.max(0, (ms - lastMs) / 1000));
  lastMs = ms;
  wall += dt;
  const a = state.audio;
  const s = a ? a.ralenti.timeScale : state.slowMotion ? 0.35 : 1;
  state.gameTime += dt * s;
  const t = state.gameTime;
  fly.update(dt);

  setBody(range.drone.object, a?.sources.drone, dronePosition(t, tmp));
  setBody(range.kart.object, a?.sources.kart, kartPosition(t, tmp));
  range.kart.object.rotation.y = kartHeading(t);
  setBody(range.orb.object, a?.sources.orb, orbPosition(t, range.camera.position, tmp));
  a?.sources.generator.setPosition(GENERATOR_POSITION.x, 1, GENERATOR_POSITION.z);
  range.animate(t);

  if (a) {
    range.camera.getWorldDirection(forward);
    up.set(0, 1, 0).applyQuaternion(range.camera.quaternion);
    const p = range.camera.position;
    listenerState.position.x = p.x, listenerState.position.y = p.y, listenerState.position.z = p.z;
    listenerState.forward.x = forward.x, listenerState.forward.y = forward.y, listenerState.forward.z = forward.z;
    listenerState.up.x = up.x, listenerState.up.y = up.y, listenerState.up.z = up.z;
    a.ralenti.setListener(listenerState);
    a.ralenti.update();
    if (wall >= nextClick) {
      nextClick = wall + 2;
      a.playClick();
    }
    panel?.update();
    updateLabels(a);
  }
  updateHud(s);
  range.render();
  requestAnimationFrame(frame);
}

let labelFrame = 0;
function updateLabels(a: SceneAudio): void {
  if (++labelFrame % 6 !== 0) return;
  const bodies = { drone: range.drone, kart: range.kart, orb: range.orb, generator: range.generator, music: range.music };
  for (const m of a.ralenti.voices) {
    const name = a.names.get(m.voice) as keyof typeof bodies | undefined;
    const body = name ? bodies[name] : undefined;
    if (body) body.readout.textContent = `${m.ratioCents >= 0 ? '+' : ''}${m.ratioCents.toFixed(0)} ¢`;
  }
}

function updateHud(s: number): void {
  const status = state.audio ? (state.slowMotion ? '<span class="slow">SLOW MOTION</span>' : 'normal time') : 'audio not started';
  hud.innerHTML = `time scale ${s.toFixed(2)} · ${status}<div class="bar"><div style="width:${Math.min(100, s * 100).toFixed(0)}%"></div></div>`;
}

requestAnimationFrame(frame);
