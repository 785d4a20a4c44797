// Sample scene entry: the night test range, fly camera, slow motion on Space, and the tuning panel once audio starts.
import * as THREE from 'three';
import { serializeTuning, type RalentiSource } from '../runtime';
import type { Vec3Like } from '../src/units';
import { dropSound, mountEditor, type DecodedAudioFile, type MountedEditor } from '../editor';
import { dronePosition, GENERATOR_POSITION, kartHeading, kartPosition, orbPosition } from './actor-paths';
import { FlyCamera, isTyping } from './fly-camera';
import { FlyThrough } from './fly-through';
import { showHelp } from './help-text';
import { startSceneAudio, type SceneAudio } from './scene-audio';
import { installSceneHandle, type SceneState } from './scene-handle';
import { showStartOverlay } from './start-overlay';
import { createTestRange } from './test-range';
import { labelAt, layoutLabels } from './label-layout';

const rangeHost = document.getElementById('range') as HTMLElement;
const hud = document.getElementById('hud') as HTMLElement;
const range = createTestRange(rangeHost);
const fly = new FlyCamera({ camera: range.camera, element: range.renderer.domElement });
fly.lookAt(-4, 0, -26);
fly.setEnabled(false);
showHelp(document.getElementById('help') as HTMLElement);

let editor: MountedEditor | null = null;
let flyThrough: FlyThrough | null = null;
const state: SceneState = {
  audio: null,
  error: null,
  slowMotion: false,
  gameTime: 0,
  tuningJson: () => (state.audio ? serializeTuning(state.audio.ralenti.tuning) : null),
  lastLoadProblems: () => (editor ? [...editor.panel.lastProblems] : []),
  playbackPath: () => editor?.panel.path.mode ?? 'engine',
  editor: () => editor?.panel ?? null,
  flyThrough: () => (flyThrough ? { ...flyThrough.summary, listener: { x: range.camera.position.x, y: range.camera.position.y, z: range.camera.position.z } } : null),
};
installSceneHandle(state);

function resize(): void {
  range.resize(rangeHost.clientWidth, rangeHost.clientHeight);
}
window.addEventListener('resize', resize);
// The range leaves room for the editor's dock (--rl-dock-width), which the designer can resize or fold.
new ResizeObserver(resize).observe(rangeHost);
resize();

// Slow motion: hold Space (ramp in with the tuning's ramp, release to leave), or T to toggle.
let held = false;
let toggled = false;
function applySlowMotion(): void {
  const want = held || toggled;
  if (want === state.slowMotion) return;
  state.slowMotion = want;
  if (state.audio && !flyThrough?.replay) requestTimeScale(want ? state.audio.ralenti.tuning.timeFlow.slowMotionScale : 1);
}

/** Asks the runtime for a time scale with the tuning's ramp and easing, and tells the fly-through recorder. */
function requestTimeScale(target: number): void {
  const r = state.audio!.ralenti;
  const tf = r.tuning.timeFlow;
  const ramp = target < r.timeScale ? tf.rampInSeconds : tf.rampOutSeconds;
  r.setTimeScale(target, { ramp, easing: tf.easing });
  flyThrough?.timeScaleRequested(target, ramp, tf.easing);
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
  const orientationNow = { forward: new THREE.Vector3(), up: new THREE.Vector3() };
  flyThrough = new FlyThrough({
    ralenti: audio.ralenti,
    doc: document,
    wantedTimeScale: () => (state.slowMotion ? audio.ralenti.tuning.timeFlow.slowMotionScale : 1),
    orientation: () => {
      range.camera.getWorldDirection(orientationNow.forward);
      orientationNow.up.set(0, 1, 0).applyQuaternion(range.camera.quaternion);
      return orientationNow;
    },
  });
  // The same entry a game uses: the scene only adds its master chain, comparison copies, recording and sound drops.
  editor = mountEditor(audio.ralenti, {
    id: 'panel',
    recording: flyThrough,
    master: audio.master,
    engineBus: audio.engineBus,
    names: audio.names,
    comparison: audio.comparison,
    restored: audio.restored,
    restoreProblems: audio.restoreProblems,
    restoreAutosave: false,
    replaceSound: (id, sound) => replaceAndLabel(audio, id, sound),
    autoUpdate: false,
  });
  audio.ralenti.onError((e) => console.warn(`ralenti audio thread: ${e.message}`));
  state.audio = audio;
  if (state.slowMotion) requestTimeScale(audio.ralenti.tuning.timeFlow.slowMotionScale);
  overlay.hide();
  fly.setEnabled(true);
});

// Interface clicks every 2 s of wall-clock time (exempt group: their rhythm and pitch ignore slow motion).
let nextClick = 2;
const forward = new THREE.Vector3();
const up = new THREE.Vector3();
const listenerState: { position: Vec3Like; forward: Vec3Like; up: Vec3Like; velocity?: Vec3Like } = { position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } };
let wall = 0;
let lastMs = performance.now();

const bodyAt = { drone: { x: 0, y: 0, z: 0 }, kart: { x: 0, y: 0, z: 0 }, orb: { x: 0, y: 0, z: 0 }, generator: { x: GENERATOR_POSITION.x, y: 1, z: GENERATOR_POSITION.z } };
type BodyName = keyof typeof bodyAt;
const bodyNames = Object.keys(bodyAt) as BodyName[];
let replaying = false;

/** Places the moving bodies and their sources for this frame: from game time, or from the replayed script. */
function placeBodies(a: SceneAudio | null, t: number): void {
  const replay = flyThrough?.replay ?? null;
  if (replay) {
    if (!replaying) fly.setEnabled(false);
    replaying = true;
    const l = replay.listener;
    range.camera.position.set(l.position.x, l.position.y, l.position.z);
    const [fx, fy, fz] = replay.script.listener.forward;
    range.camera.lookAt(l.position.x + fx, l.position.y + fy, l.position.z + fz);
  } else if (replaying) {
    // Replay over: the player steers again from where the recording left the camera; velocities are estimated again.
    replaying = false;
    fly.lookAt(range.camera.position.x + forward.x, range.camera.position.y + forward.y, range.camera.position.z + forward.z);
    fly.setEnabled(true);
    for (const name of bodyNames) a?.sources[name].clearVelocity();
  }
  dronePosition(t, bodyAt.drone);
  kartPosition(t, bodyAt.kart);
  orbPosition(t, range.camera.position, bodyAt.orb);
  for (const name of bodyNames) {
    const p = bodyAt[name];
    const r = replay?.source(name);
    if (r) (p.x = r.position.x), (p.y = r.position.y), (p.z = r.position.z);
    const body = name === 'generator' ? null : range[name].object;
    body?.position.set(p.x, p.y, p.z);
    const source = a?.sources[name];
    source?.setPosition(p.x, p.y, p.z);
    // A replay sends the path's exact velocities, as the offline renderer does for the same script.
    if (r && source) source.setVelocity(r.velocity.x, r.velocity.y, r.velocity.z);
  }
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
  flyThrough?.advance(ms / 1000);
  placeBodies(a, t);
  flyThrough?.record(ms / 1000, range.camera.position, bodyAt);
  range.kart.object.rotation.y = kartHeading(t);
  range.animate(t);

  if (a) {
    range.camera.getWorldDirection(forward);
    up.set(0, 1, 0).applyQuaternion(range.camera.quaternion);
    const p = range.camera.position;
    listenerState.position.x = p.x, listenerState.position.y = p.y, listenerState.position.z = p.z;
    listenerState.forward.x = forward.x, listenerState.forward.y = forward.y, listenerState.forward.z = forward.z;
    listenerState.up.x = up.x, listenerState.up.y = up.y, listenerState.up.z = up.z;
    const replay = flyThrough?.replay;
    if (replay) listenerState.velocity = replay.listener.velocity;
    else delete listenerState.velocity;
    a.ralenti.setListener(listenerState);
    a.ralenti.update();
    if (wall >= nextClick) {
      nextClick = wall + 2;
      a.playClick();
    }
    editor?.panel.update();
    updateLabels(a);
  }
  updateHud(s);
  range.render();
  layoutLabels(rangeHost, labelElements);
  requestAnimationFrame(frame);
}

const labelElements = [range.drone, range.kart, range.orb, range.generator, range.music, range.console].map((b) => b.label);
const soundBodies = (['drone', 'kart', 'orb', 'generator', 'music'] as const).map((name) => ({ label: range[name].label, value: name }));

// Drop an audio file on a source's label (or near it) to replace that source's sound for the rest of the session.
rangeHost.addEventListener('dragover', (e) => {
  if (state.audio && e.dataTransfer?.types.includes('Files')) e.preventDefault();
});
rangeHost.addEventListener('drop', (e) => {
  const file = e.dataTransfer?.files?.[0];
  const a = state.audio;
  if (!file || !a || !editor) return;
  e.preventDefault();
  const name = labelAt(e.clientX, e.clientY, soundBodies);
  if (!name) return editor.panel.notice.say(`${file.name}: drop it on a source's label to replace its sound.`, 'warn');
  const id = a.names.voices.find((v) => a.voiceNames.get(v.voiceId) === name)?.voiceId ?? -1;
  void dropOnSource(file, id);
});

async function dropOnSource(file: File, voiceId: number): Promise<void> {
  const a = state.audio!;
  await dropSound(file, voiceId, a.context, (id, sound) => replaceAndLabel(a, id, sound), editor!.panel.notice);
}

/** Replaces a voice's sound (dropped on its label or on its readout row) and names the file on the body's label. */
function replaceAndLabel(a: SceneAudio, voiceId: number, sound: DecodedAudioFile): string {
  const name = a.voiceNames.get(voiceId) as (typeof soundBodies)[number]['value'] | undefined;
  const shown = a.replaceSound(voiceId, sound);
  if (name) range[name].label.querySelector('i')!.textContent = `${a.dropped(name)} (dropped)`;
  return shown;
}

let labelFrame = 0;
function updateLabels(a: SceneAudio): void {
  if (++labelFrame % 6 !== 0) return;
  const bodies = { drone: range.drone, kart: range.kart, orb: range.orb, generator: range.generator, music: range.music };
  for (const m of a.ralenti.voices) {
    const name = a.voiceNames.get(m.voice) as keyof typeof bodies | undefined;
    const body = name ? bodies[name] : undefined;
    if (body) body.readout.textContent = `${m.ratioCents >= 0 ? '+' : ''}${m.ratioCents.toFixed(0)} ¢`;
  }
}

function updateHud(s: number): void {
  const status = state.audio ? (state.slowMotion ? '<span class="slow">SLOW MOTION</span>' : 'normal time') : 'audio not started';
  hud.innerHTML = `time scale ${s.toFixed(2)} · ${status}<div class="bar"><div style="width:${Math.min(100, s * 100).toFixed(0)}%"></div></div>`;
}

requestAnimationFrame(frame);
