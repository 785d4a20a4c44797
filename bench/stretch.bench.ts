// Time-stretch benchmark: CPU of 'stretch' voices at 48 kHz in the engine, beside 256 tape-style voices, with the
// default settings (standard tier, default kernel, default grain and tolerance); the cost per stretched voice is the
// difference against the same engine without them, measured back to back in the same run (median of 5, with spread).
import { Engine } from '../src/engine';
import { parseTuning, defaultTuning, serializeTuning } from '../src/tuning';
import { KernelTable, StreamReader } from '../src/dsp';
import { StretchReader } from '../src/stretch';

const SR = 48000;
const BLOCK = 128;
const TAPE_VOICES = 256;

function tone(hz: number, seconds: number, channels: number): Float32Array[] {
  const out: Float32Array[] = [];
  const n = Math.round(seconds * SR);
  for (let c = 0; c < channels; c++) {
    const x = new Float32Array(n);
    for (let i = 0; i < n; i++) x[i] = 0.02 * Math.sin((2 * Math.PI * hz * (1 + c * 0.01) * i) / SR) + 0.005 * Math.sin((2 * Math.PI * 3.1 * hz * i) / SR);
    out.push(x);
  }
  return out;
}

/** An engine with 256 tape-style stereo voices ('effects', looping) and `stretched` stereo voices of a 'stretch' group. */
function scene(stretched: number): Engine {
  const json = JSON.parse(serializeTuning(defaultTuning));
  json.groups.music.policy = 'stretch';
  json.groups.music.pitch = { interpolation: 'linear', keys: [{ x: 0, y: 0 }, { x: 4, y: 4 }] };
  const engine = new Engine({ sampleRate: SR, capacity: TAPE_VOICES + stretched, maxStretchVoices: Math.max(stretched, 1), tuning: parseTuning(json) });
  const sounds = [0, 1, 2, 3].map((k) => engine.addSound(tone(110 * (k + 1), 1.5 + k * 0.5, 2), SR));
  for (let i = 0; i < TAPE_VOICES; i++) engine.play(sounds[i % 4], { loop: true, group: 'effects', ratio: 0.8 + (i % 9) * 0.05, gain: 0.5 });
  for (let i = 0; i < stretched; i++) engine.play(sounds[i % 4], { loop: true, group: 'music', gain: 0.5 });
  return engine;
}

/** Share of one core (rendering time ÷ audio time) over `seconds`, the time scale gliding 1 → 0.35 → 1. */
function share(engine: Engine, seconds: number): number {
  const l = new Float32Array(BLOCK);
  const r = new Float32Array(BLOCK);
  for (let b = 0; b < 40; b++) engine.render([l, r], BLOCK);
  const blocks = Math.round((seconds * SR) / BLOCK);
  const t0 = performance.now();
  for (let b = 0; b < blocks; b++) {
    if (b % 150 === 0) engine.setTimeScale({ target: (b / 150) % 2 === 0 ? 0.35 : 1, rampSeconds: 0.25, easing: 'smooth' });
    engine.render([l, r], BLOCK);
  }
  return (performance.now() - t0) / 1000 / seconds;
}

/** The stretcher alone (stereo, speed 0.35, pitch kept) against one StreamReader at ratio 0.35: cost ratio. */
function alone(seconds: number): { stretcher: number; reader: number } {
  const src = tone(220, 2, 2);
  const out = [new Float32Array(BLOCK), new Float32Array(BLOCK)];
  const s = new StretchReader({ table: KernelTable.forTier('standard'), channels: 2, sampleRate: SR });
  const r = new StreamReader({ table: KernelTable.forTier('standard'), channels: 2 });
  s.setSource(src, { loop: true });
  r.setSource(src, { loop: true });
  const blocks = Math.round((seconds * SR) / BLOCK);
  let t0 = performance.now();
  for (let b = 0; b < blocks; b++) s.read(out, 0, BLOCK, 0.35, 0.35, 1, 1);
  const stretcher = (performance.now() - t0) / 1000 / seconds;
  t0 = performance.now();
  for (let b = 0; b < blocks; b++) r.read(out, 0, BLOCK, 0.35, 0.35);
  const reader = (performance.now() - t0) / 1000 / seconds;
  return { stretcher, reader };
}

const median = (xs: number[]): number => [...xs].sort((a, b) => a - b)[xs.length >> 1];

/** Runs the stretch benchmark; prints a table unless `json`. */
export async function run(options: { json: boolean }): Promise<object> {
  const seconds = 1;
  const counts = [0, 16, 32];
  const runs: Record<number, number[]> = { 0: [], 16: [], 32: [] };
  for (let k = 0; k < 5; k++) for (const n of counts) runs[n].push(share(scene(n), seconds));
  const base = median(runs[0]);
  const per = counts.slice(1).map((n) => ({ stretched: n, share: median(runs[n]), perVoice: (median(runs[n]) - base) / n, spread: [Math.min(...runs[n]), Math.max(...runs[n])] }));
  const perVoice = median(per.map((p) => p.perVoice));
  const fit = Math.floor((0.5 - base) / perVoice);
  const solo = [0, 1, 2].map(() => alone(0.5));
  const stretcher = median(solo.map((s) => s.stretcher));
  const reader = median(solo.map((s) => s.reader));
  if (!options.json) {
    console.log(`256 tape-style voices alone: ${(base * 100).toFixed(1)} % of one core (spread ${(Math.min(...runs[0]) * 100).toFixed(1)}…${(Math.max(...runs[0]) * 100).toFixed(1)} %)`);
    for (const p of per) console.log(`+ ${p.stretched} stretched voices: ${(p.share * 100).toFixed(1)} % (spread ${(p.spread[0] * 100).toFixed(1)}…${(p.spread[1] * 100).toFixed(1)} %), ${(p.perVoice * 100).toFixed(2)} % per stretched voice`);
    console.log(`stretched voices that fit beside 256 tape-style voices in 50 % of one core: ${fit} (goal ≥ 16 → ${fit >= 16 ? 'met' : 'not met'})`);
    console.log(`stretcher alone (stereo, speed 0.35): ${(stretcher * 100).toFixed(2)} % of one core = ${(stretcher / reader).toFixed(1)}× one StreamReader at ratio 0.35 (${(reader * 100).toFixed(2)} %)`);
  }
  return { tapeOnly: base, per, perVoice, fit, stretcherAlone: stretcher, readerAlone: reader };
}
