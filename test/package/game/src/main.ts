// A small web game built from the packed tarball: a three.js scene, howler, and Ralenti through the README's two
// snippets. The consumer test opens index.html?mode=howler|plain|decode, clicks the button and reads window.game.
import { Howl, Howler } from 'howler';
import * as THREE from 'three';
import { HowlerBridge, type HowlerGlobalLike } from 'ralenti/howler';
import { createRalenti, decodeAudioFile } from 'ralenti/runtime';
import { startAudio } from './readme-three-howler.js';
import { startSiren } from './readme-web-audio.js';
import { entries } from './entries.js';

/** What the test reads: measured values, done when finished, the first error's text. */
interface GameReport {
  done: boolean;
  error: string | null;
  values: Record<string, number>;
}

const report: GameReport = { done: false, error: null, values: {} };
(window as unknown as { game: GameReport }).game = report;
const sleep = (ms: number) => new Promise<void>((done) => setTimeout(done, ms));

/**
 * Frequency in Hz of the analyser's latest window: the median time between rising zero crossings (each placed by
 * linear interpolation), so that a dropout on a busy machine spoils a few periods and not the estimate.
 */
function frequency(analyser: AnalyserNode): number {
  const x = new Float32Array(analyser.fftSize);
  analyser.getFloatTimeDomainData(x);
  const periods: number[] = [];
  let previous = -1;
  for (let i = 1; i < x.length; i++) {
    if (x[i - 1] < 0 && x[i] >= 0) {
      const t = i - 1 + x[i - 1] / (x[i - 1] - x[i]);
      if (previous >= 0) periods.push(t - previous);
      previous = t;
    }
  }
  if (periods.length === 0) return 0;
  periods.sort((a, b) => a - b);
  return analyser.context.sampleRate / periods[Math.floor(periods.length / 2)];
}

/** Resolves to performance.now() when the analyser first holds a non-silent sample. */
async function firstSound(analyser: AnalyserNode): Promise<number> {
  const x = new Float32Array(analyser.fftSize);
  for (;;) {
    analyser.getFloatTimeDomainData(x);
    if (x.some((v) => Math.abs(v) > 1e-6)) return performance.now();
    await sleep(1);
  }
}

/** A 8192-frame analyser fed by `node`. */
function tap(node: AudioNode): AnalyserNode {
  const analyser = node.context.createAnalyser();
  analyser.fftSize = 8192;
  node.connect(analyser);
  return analyser;
}

/**
 * The frequency once it has settled: three readings 150 ms apart within 3 cents of each other, or the median of the
 * readings after `limitMs` (a busy machine delays timers and frames, so fixed waits would read mid-change).
 */
async function settled(analyser: AnalyserNode, limitMs: number): Promise<number> {
  const readings: number[] = [];
  const end = performance.now() + limitMs;
  const close = (a: number, b: number) => Math.abs(1200 * Math.log2(a / b)) < 3;
  for (;;) {
    await sleep(150);
    readings.push(frequency(analyser));
    const [a, b, c] = readings.slice(-3);
    if (c !== undefined && close(a, b) && close(b, c)) return c;
    if (performance.now() > end) return [...readings].sort((x, y) => x - y)[Math.floor(readings.length / 2)];
  }
}

/**
 * Still, moving towards the listener, still again, then slow motion: the frequency heard in each state. A change of
 * motion is heard once the sound emitted after it has travelled to the listener: `travelMs()` is that delay now.
 */
async function measure(analyser: AnalyserNode, move: (on: boolean) => void, slow: () => number, movingMs: number, travelMs: () => number = () => 0): Promise<void> {
  await sleep(300);
  report.values.still = await settled(analyser, 3000);
  move(true);
  await sleep(300 + travelMs());
  report.values.moving = await settled(analyser, movingMs);
  move(false);
  await sleep(300 + travelMs());
  report.values.stillAgain = await settled(analyser, 3000);
  report.values.slowScale = slow();
  await sleep(300);
  report.values.slow = await settled(analyser, 4000);
}

/** The README's three.js + howler snippet: a drone on the camera's line of sight 150 m away, approaching at 40 m/s. */
async function howlerGame(clicked: number): Promise<void> {
  new Howl({ src: ['sounds/rotor.ogg', 'sounds/rotor.mp3'], preload: false });
  const scene = new THREE.Scene();
  const camera = new THREE.PerspectiveCamera(60, 1, 0.1, 1000);
  const drone = new THREE.Object3D();
  drone.position.set(0, 0, -150);
  scene.add(camera, drone);
  scene.updateMatrixWorld(true);
  const audio = await startAudio(camera, drone, undefined);
  const analyser = tap(Howler.masterGain);
  let speed = 0;
  let last = performance.now();
  const timer = setInterval(() => {
    const now = performance.now();
    drone.position.z += (speed * (now - last)) / 1000;
    last = now;
    scene.updateMatrixWorld();
    audio.frame(now);
  }, 16);
  report.values.clickToAudioMs = (await firstSound(analyser)) - clicked;
  report.values.speedOfSound = 331.3 * Math.sqrt(1 + 20 / 273.15); // at the built-in 20 °C (docs/references.md §2)
  report.values.approachSpeed = 40;
  await measure(analyser, (on) => (speed = on ? 40 : 0), () => {
    audio.slowMotion(true);
    return entries.defaultTuning.timeFlow.slowMotionScale;
  }, 2000, () => (1000 * -drone.position.z) / report.values.speedOfSound); // sound travels: docs/physics.md
  clearInterval(timer);
}

/** The README's plain Web Audio snippet (the inlined worklet entry). */
async function plainGame(clicked: number): Promise<void> {
  const { ralenti, frame } = await startSiren('sounds/rotor.wav');
  const analyser = tap(ralenti.node);
  let seconds = 0;
  let moving = false;
  let last = performance.now();
  const timer = setInterval(() => {
    const now = performance.now();
    // The pass runs 1.6 s at most (x = −12 m): still approaching, however late the timers fire.
    if (moving) seconds = Math.min(1.6, seconds + (now - last) / 1000);
    last = now;
    frame(seconds);
  }, 16);
  report.values.clickToAudioMs = (await firstSound(analyser)) - clicked;
  await measure(analyser, (on) => (moving = on), () => {
    ralenti.setTimeScale(0.25);
    return 0.25;
  }, 1000);
  clearInterval(timer);
}

/** Decoding: the file's own rate through decodeAudioFile and HowlerBridge.loadSrc, the browser's resampling for contrast. */
async function decodeCheck(): Promise<void> {
  const ctx = new AudioContext({ sampleRate: 48000 });
  const bytes = await (await fetch('sounds/rotor.wav')).arrayBuffer();
  report.values.contextRate = ctx.sampleRate;
  report.values.browserDecodeFrames = (await ctx.decodeAudioData(bytes.slice(0))).length;
  const own = await decodeAudioFile(bytes.slice(0), { context: ctx });
  report.values.ownFrames = own.length;
  report.values.ownRate = own.sampleRate;
  const fakeHowler = {
    ctx, masterGain: ctx.createGain(), autoSuspend: true, usingWebAudio: true, noAudio: false,
    volume: () => 1, mute: () => fakeHowler, unload: () => fakeHowler, codecs: () => true,
  } as unknown as HowlerGlobalLike;
  const bridge = new HowlerBridge({ howler: fakeHowler, create: createRalenti });
  const started = performance.now();
  await bridge.start();
  report.values.startMs = performance.now() - started; // processor module, engine and resampler table on the audio thread
  const loading = performance.now();
  const sound = await bridge.loadSrc('sounds/rotor.wav');
  report.values.loadMs = performance.now() - loading; // fetch, decode at the file's rate, upload
  report.values.bridgeFrames = sound.frames;
  report.values.bridgeRate = sound.sampleRate;
  report.values.bridgeContextRate = bridge.ralenti?.context.sampleRate ?? 0;
  bridge.stop();
}

const mode = new URLSearchParams(location.search).get('mode') ?? 'howler';
document.getElementById('start')?.addEventListener('click', () => {
  const clicked = performance.now();
  const run = mode === 'plain' ? plainGame(clicked) : mode === 'decode' ? decodeCheck() : howlerGame(clicked);
  run.then(
    () => (report.done = true),
    (e: unknown) => {
      report.error = e instanceof Error ? `${e.name}: ${e.message}` : String(e);
      report.done = true;
    },
  );
}, { once: true });
