// Browser side of the parity suite: renders a ParityScene through createRalenti in an OfflineAudioContext,
// applying each step at its frame with OfflineAudioContext.suspend() and waiting for the worklet to take it.
import { createRalenti, type RalentiPlayOptions, type RalentiVoice } from '../../runtime/index';
import type { PlayOptions } from '../../src/index';
import { createRalenti as createRalentiInline } from '../../runtime/inline';
import { PARITY_RATE, type SceneAction, type SceneStep } from './parity-scene';

/** A scene as it crosses into the page (plain arrays). */
export interface WireScene {
  frames: number;
  sounds: { channels: number[][]; sampleRate: number }[];
  sources: number;
  steps: SceneStep[];
}

/** What a render returns to the test. */
export interface PageRender {
  left: number[];
  right: number[];
  errors: string[];
  renderMs: number;
  /** Resampler kernel the worklet's engine reported ('wasm-simd' where WebAssembly SIMD loads in the audio thread). */
  kernel: string;
  /** Voice events as delivered on the main thread, in order: '<scene voice> <type>'. */
  events: string[];
}

/** The scene's engine-level play options in the runtime's units (gain in dB, loop points in seconds). */
function runtimeOptions(o: PlayOptions, rate: number): RalentiPlayOptions {
  const { gain, loopStart, loopEnd, sourceId: _sourceId, ...rest } = o;
  return {
    ...rest,
    ...(gain === undefined ? {} : { gainDb: 20 * Math.log10(gain) }),
    ...(loopStart === undefined ? {} : { loopStartSeconds: loopStart / rate }),
    ...(loopEnd === undefined ? {} : { loopEndSeconds: loopEnd / rate }),
  };
}

/** Renders with the processor from `workletUrl`, or from the inlined entry's Blob URL when it is null. */
async function renderScene(scene: WireScene, workletUrl: string | null): Promise<PageRender> {
  const ctx = new OfflineAudioContext(2, scene.frames, PARITY_RATE);
  const r = workletUrl === null ? await createRalentiInline(ctx) : await createRalenti(ctx, { workletUrl });
  r.connect(ctx.destination);
  const errors: string[] = [];
  r.onError((e) => errors.push(`${e.where}: ${e.message}`));
  const sounds = scene.sounds.map((s) => r.load({ channels: s.channels.map((c) => Float32Array.from(c)), sampleRate: s.sampleRate }));
  const sources = Array.from({ length: scene.sources }, () => r.createSource());
  const voices = new Map<number, RalentiVoice>();
  const events: string[] = [];
  r.onVoiceEvent((e) => events.push(`${[...voices].find(([, v]) => v === e.voice)?.[0]} ${e.type}`));
  const apply = (actions: SceneAction[], frame: number) => {
    for (const a of actions) {
      if (a.kind === 'play') voices.set(a.voice, r.play(sounds[a.sound], { ...runtimeOptions(a.options, scene.sounds[a.sound].sampleRate), source: a.source ? sources[a.source - 1] : undefined }));
      else if (a.kind === 'stop') voices.get(a.voice)?.stop({ fade: a.fadeSeconds });
      else if (a.kind === 'set-ratio') voices.get(a.voice)?.setRatio(a.ratio);
      else if (a.kind === 'time-scale') r.setTimeScale(a.target, { ramp: a.ramp, easing: a.easing });
      else if (a.kind === 'pause') r.pause(a.group);
      else if (a.kind === 'resume') r.resume(a.group);
      else if (a.kind === 'group') {
        if (a.volumeDb !== undefined) r.setGroupVolume(a.group, a.volumeDb);
        if (a.muted !== undefined) r.setGroupMute(a.group, a.muted);
        if (a.solo !== undefined) r.setGroupSolo(a.group, a.solo);
      } else if (a.kind === 'seek') voices.get(a.voice)?.seek(a.seconds);
      else if (a.kind === 'spatial') sources[a.source - 1].setSpatial(a.spatial);
      else {
        r.setListener(a.listener);
        for (const s of a.sources) {
          const src = sources[s.id - 1].setPosition(s.position.x, s.position.y, s.position.z);
          if (s.velocity) src.setVelocity(s.velocity.x, s.velocity.y, s.velocity.z);
        }
        r.update(frame / PARITY_RATE);
      }
    }
  };
  const pending: Promise<void>[] = [];
  for (const step of scene.steps) {
    if (step.frame === 0) {
      apply(step.actions, 0);
      continue;
    }
    pending.push(
      ctx.suspend(step.frame / PARITY_RATE).then(async () => {
        apply(step.actions, step.frame);
        await r.flush();
        await ctx.resume();
      }),
    );
  }
  await r.flush();
  const t0 = performance.now();
  const buffer = await ctx.startRendering();
  const renderMs = performance.now() - t0;
  await Promise.all(pending);
  await r.flush();
  const kernel = String(r.stats.kernel);
  r.dispose();
  return { left: Array.from(buffer.getChannelData(0)), right: Array.from(buffer.getChannelData(1)), errors, renderMs, kernel, events };
}

/** Sends a malformed command straight to the port mid-render; returns the reported errors, the last stats and the peak after it. */
async function probeBadCommand(): Promise<{ errors: string[]; statsErrors: number; activeVoices: number; peakAfter: number }> {
  const ctx = new OfflineAudioContext(2, 0.3 * PARITY_RATE, PARITY_RATE);
  const r = await createRalenti(ctx, { workletUrl: '/ralenti-processor.js', statsIntervalSeconds: 0.05 });
  r.connect(ctx.destination);
  const errors: string[] = [];
  r.onError((e) => errors.push(`${e.where}: ${e.message}`));
  const tone = new Float32Array(4800).map((_, i) => 0.25 * Math.sin((2 * Math.PI * 500 * i) / PARITY_RATE));
  r.play(r.load({ channels: [tone], sampleRate: PARITY_RATE }), { group: 'interface', loop: true });
  const done = ctx.suspend(0.1).then(async () => {
    r.node.port.postMessage({ type: 'play', voice: 'not-a-handle' });
    await r.flush();
    await ctx.resume();
  });
  await r.flush();
  const buffer = await ctx.startRendering();
  await done;
  await r.flush();
  // A finished offline context reads as closed, so flush() settles at once; stats posted by the last render quanta may
  // still be in flight on the port: wait for them (bounded) before reading the counters.
  for (let i = 0; i < 100 && r.stats.errors < 1; i++) await new Promise((res) => setTimeout(res, 20));
  const left = buffer.getChannelData(0);
  let peakAfter = 0;
  for (let i = Math.round(0.15 * PARITY_RATE); i < left.length; i++) peakAfter = Math.max(peakAfter, Math.abs(left[i]));
  const result = { errors, statsErrors: r.stats.errors, activeVoices: r.stats.activeVoices, peakAfter };
  r.dispose();
  return result;
}

Object.assign(globalThis, { renderScene, probeBadCommand });
