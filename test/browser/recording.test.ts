// Fly-through recording in real Chromium: record a pass in the sample scene, download it as a scene script, check it
// in Node with `ralenti check`, then load it back and replay it. Served by `npm start`'s own server on a free port.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { Page } from 'playwright-core';
import { browserSuiteMode } from './browser-harness';
import { openScenePage, waitForState, type ScenePage } from './scene-page';
import { parseSceneScript } from '../../runtime/offline/parse-scene-script';
import { evaluateMotion } from '../../runtime/offline/scene-motion';
import type { SceneScript } from '../../runtime/offline/scene-types';
import { readWav } from '../../runtime/offline/wav';
import { dronePosition } from '../../sample-scene/actor-paths';
import { runCli } from '../runtime/cli/run-cli';

const mode = browserSuiteMode();
if (mode === 'skip') console.warn('recording browser suite skipped: /usr/bin/chromium is absent and CI is not set (apt-get install chromium, or run .ci/run)');

const repo = resolve(__dirname, '../..');

type Vec = { x: number; y: number; z: number };
interface FlyState {
  recording: boolean;
  replaying: boolean;
  seconds: number;
  frames: number;
  replayTime: number;
  scriptSeconds: number;
  listener: Vec;
}
type Handle = { ready: boolean; error: string | null; timeScale: number; gameTime: number; voices: { name: string }[]; flyThrough: FlyState | null; tuningJson: string | null };

const handle = (page: Page) =>
  page.evaluate(() => {
    const h = (window as unknown as { ralentiScene: Handle }).ralentiScene;
    return { ready: h.ready, error: h.error, timeScale: h.timeScale, gameTime: h.gameTime, voices: h.voices, flyThrough: h.flyThrough, tuningJson: h.tuningJson };
  });

const waitFor = (page: Page, what: string, test: (h: Handle) => boolean, timeoutMs = 10_000) => waitForState(page, handle, what, test, timeoutMs, 50);

const button = (page: Page, text: string) => page.locator('#panel button', { hasText: text });

const cli = (...argv: string[]) => runCli(argv);

describe.skipIf(mode === 'skip')('fly-through recording in Chromium', () => {
  let scene: ScenePage | null = null;
  let page: Page;
  const work = mkdtempSync(join(tmpdir(), 'ralenti-recording-'));
  const recorded = join(work, 'recorded.json');
  const recordedAudio = join(work, 'recorded.wav');
  let consoleErrors: string[] = [];
  let script: SceneScript;

  beforeAll(async () => {
    if (mode === 'fail') throw new Error('CI is set but /usr/bin/chromium is missing; .ci/run installs it with apt-get install -y chromium');
    scene = await openScenePage(work, { width: 640, height: 360 });
    page = scene.page;
    consoleErrors = scene.consoleErrors;
    await page.click('#start-button');
    const h = await waitFor(page, 'audio to start', (x) => x.ready || x.error !== null, 20_000);
    expect(h.error).toBeNull();
    await waitFor(page, 'the scene voices', (x) => x.voices.length >= 5);
    await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
  }, 90_000);

  afterAll(async () => {
    await scene?.close();
    rmSync(work, { recursive: true, force: true });
  });

  it('records a pass flown with the keys, with slow motion held, and downloads it as a scene script', async () => {
    expect(await page.locator('#panel .tp-fldv_t', { hasText: 'Fly-through recording' }).count()).toBe(1);
    // Start when the drone is about 100 m up-range, so that it passes the camera while slow motion is held.
    const p = { x: 0, y: 0, z: 0 };
    await waitFor(page, 'the drone about 100 m up-range', (x) => Math.abs(dronePosition(x.gameTime, p).x + 100) < 12, 20_000);
    await button(page, 'Start recording').click();
    await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
    await waitFor(page, 'recording', (x) => x.flyThrough?.recording === true);
    // Fly fast toward the runway (the drone's pass runs along x, 14 m in front of the start point, 6 m up).
    await page.keyboard.down('ShiftLeft');
    await page.keyboard.down('KeyW');
    await page.waitForTimeout(1300);
    await page.keyboard.up('KeyW');
    await page.keyboard.up('ShiftLeft');
    await page.keyboard.down('KeyD');
    await page.waitForTimeout(400);
    await page.keyboard.up('KeyD');
    // Hold slow motion for a moment, then let time return to 1.
    const target = JSON.parse((await handle(page)).tuningJson!).timeFlow.slowMotionScale as number;
    await page.keyboard.down('Space');
    await waitFor(page, `time scale ${target}`, (x) => Math.abs(x.timeScale - target) < 0.005);
    await page.waitForTimeout(1500);
    await page.keyboard.up('Space');
    await waitFor(page, 'time scale 1', (x) => Math.abs(x.timeScale - 1) < 0.005);
    await page.waitForTimeout(800);
    await button(page, 'Stop recording').click();
    const h = await waitFor(page, 'the recording to stop', (x) => x.flyThrough?.recording === false);
    expect(h.flyThrough!.seconds).toBeGreaterThan(4);
    await expect.poll(() => page.locator('.rl-rec-status').textContent()).toMatch(/Recorded \d+\.\d s/);

    const [download] = await Promise.all([page.waitForEvent('download'), button(page, 'Download scene script').click()]);
    await download.saveAs(recorded);
    script = parseSceneScript(JSON.parse(readFileSync(recorded, 'utf8')));
    mkdirSync(join(repo, 'test-artifacts'), { recursive: true });
    copyFileSync(recorded, join(repo, 'test-artifacts', 'recorded-flythrough.json'));

    expect(script.duration).toBeCloseTo(h.flyThrough!.seconds, 3);
    expect(Object.keys(script.sources).sort()).toEqual(['drone', 'generator', 'kart', 'orb']);
    expect(script.sources.generator.motion.type).toBe('fixed');
    expect(script.voices.map((v) => `${v.sound}@${v.source}:${v.group}`)).toEqual(['drone@drone:vehicles', 'kart@kart:vehicles', 'orb@orb:effects', 'generator@generator:ambience']);
    // The camera path: a key per animation frame (at most 60 per second), moved by the keys (32 m/s for 1 s).
    const l = script.listener.motion;
    expect(l.type).toBe('keyframes');
    if (l.type !== 'keyframes') return;
    expect(l.keys.length).toBeGreaterThan(10);
    expect(l.keys[0].time).toBeGreaterThanOrEqual(0);
    expect(l.keys.length).toBeLessThanOrEqual(Math.min(h.flyThrough!.frames, 60 * script.duration + 2));
    const [a, b] = [l.keys[0].position, l.keys[l.keys.length - 1].position];
    expect(Math.hypot(b[0] - a[0], b[1] - a[1], b[2] - a[2])).toBeGreaterThan(20);
    // The time-scale requests, with their ramps: down to the slow-motion target, then back to 1.
    expect(script.timeScale.map((k) => k.target)).toEqual([target, 1]);
    expect(script.timeScale[1].time - script.timeScale[0].time).toBeGreaterThan(1);
    // The drone wraps every 8 s of game time; a wrap is written as a cut, never as a supersonic segment.
    const v = { x: 0, y: 0, z: 0 };
    for (let t = 0; t < script.duration; t += 0.005) {
      evaluateMotion(script.sources.drone.motion, t, p, v);
      expect(Math.hypot(v.x, v.y, v.z)).toBeLessThan(60);
    }
  });

  it('captures what the engine played during the recording and offers it as a WAV file of the same length', async () => {
    await expect.poll(async () => (await button(page, 'Download recorded audio').isDisabled()) === false).toBe(true);
    const [download] = await Promise.all([page.waitForEvent('download'), button(page, 'Download recorded audio').click()]);
    await download.saveAs(recordedAudio);
    copyFileSync(recordedAudio, join(repo, 'test-artifacts', 'recorded-flythrough.wav'));
    const wav = readWav(readFileSync(recordedAudio));
    expect(wav.channels.length).toBe(2);
    // Start and stop reach the audio thread by message; on a loaded 2-core machine a message can wait tens of ms, so the
    // lengths agree within 0.1 s (the alignment of audio and motion is a known open point, docs/checker.md).
    expect(Math.abs(wav.channels[0].length / wav.sampleRate - script.duration)).toBeLessThan(0.1);
    // Not silence: the scene's voices were playing through the engine while it recorded.
    let peak = 0;
    for (const x of wav.channels[0]) peak = Math.max(peak, Math.abs(x));
    expect(peak).toBeGreaterThan(0.01);
  });

  it.each([
    ['the audio the browser played', () => ['--audio', recordedAudio], /^judged the recording /m],
    ['an offline re-render', () => [], /^judged an offline re-render of the script$/m],
  ])('judges the recording in Node with `ralenti check` on %s: a verdict per voice, each failure with a time', async (_name, extra, mode) => {
    const r = await cli('check', recorded, '-q', '--report', join(work, 'report.png'), ...extra());
    expect(r.err).toBe('');
    expect(r.out).toMatch(mode);
    for (const voice of ['voice 0 (drone on drone)', 'voice 1 (kart on kart)', 'voice 2 (orb on orb)', 'voice 3 (generator on generator)']) {
      expect(r.out).toMatch(new RegExp(`^(PASS|FAIL) {2}${voice.replace(/[()]/g, '\\$&')} \\[\\w+ Doppler\\]: median [\\d.–]+, p95 [\\d.–]+`, 'm'));
    }
    // Each failure names its voice, and a time (an error) or the judged share (too little judged).
    for (const line of r.out.split('\n').filter((l) => /^ {6}voice \d/.test(l))) expect(line).toMatch(/\d+\.\d\d s|% of the sounding frames judged|no frame could be judged/);
    // Pass or fail, never bad input or an internal error; see docs/checker.md for what today's default engine gets.
    expect([0, 1]).toContain(r.code);
    expect(Array.from(readFileSync(join(work, 'report.png')).subarray(1, 4))).toEqual([80, 78, 71]);
  }, 180_000);

  it('replays a loaded script: the camera follows the recorded path and the time scale follows its keys', async () => {
    await page.setInputFiles('#ralenti-scene-file', recorded);
    await expect.poll(() => page.locator('.rl-rec-status').textContent()).toContain('recorded.json: loaded');
    await button(page, 'Replay').click();
    await waitFor(page, 'the replay to start', (x) => x.flyThrough?.replaying === true);
    const p = { x: 0, y: 0, z: 0 };
    const v = { x: 0, y: 0, z: 0 };
    let worst = 0;
    let slowest = 1;
    for (let h = await handle(page); h.flyThrough!.replaying; h = await handle(page)) {
      evaluateMotion(script.listener.motion, h.flyThrough!.replayTime, p, v);
      const c = h.flyThrough!.listener;
      worst = Math.max(worst, Math.hypot(c.x - p.x, c.y - p.y, c.z - p.z));
      slowest = Math.min(slowest, h.timeScale);
      await page.waitForTimeout(100);
    }
    expect(worst).toBeLessThan(1e-6);
    expect(slowest).toBeLessThan(script.timeScale[0].target + 0.01);
    await expect.poll(() => page.locator('.rl-rec-status').textContent()).toContain('Replay finished');
    expect((await handle(page)).timeScale).toBeCloseTo(1, 2);
  }, 60_000);

  it('lists a malformed script’s problems by JSON path and keeps the loaded one', async () => {
    const bad = JSON.parse(readFileSync(recorded, 'utf8'));
    bad.voices[0].sound = 'horn';
    bad.timeScale[0].target = 'slow';
    await page.setInputFiles('#ralenti-scene-file', { name: 'bad-scene.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(bad)) });
    await expect.poll(() => page.locator('.rl-rec-bad').textContent()).toContain('bad-scene.json: not loaded');
    const paths = await page.locator('.rl-rec-problems code').allTextContents();
    expect(paths).toEqual(expect.arrayContaining(['voices[0].sound', 'timeScale[0].target']));
    expect((await handle(page)).flyThrough!.scriptSeconds).toBeCloseTo(script.duration, 6);
    expect(consoleErrors).toEqual([]);
  });
});
