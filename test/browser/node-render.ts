// Node side of the parity suite: the same scene driven straight into src/engine, block by block (128 frames),
// mirroring what the runtime sends (context time = engine time, the node being created at time 0).
import { Engine, voiceEventName } from '../../src/engine/index';
import type { KernelPreference, SourceSpatial, SourceState, Vec3Like } from '../../src/index';
import { defaultTuning } from '../../src/tuning/index';
import { PARITY_RATE, QUANTUM, type ParityScene } from './parity-scene';

const v = (p: Vec3Like): Vec3Like => ({ x: p.x, y: p.y, z: p.z });

/** Renders `scene` with the engine in Node; returns the stereo output. */
export function renderInNode(scene: ParityScene, kernel: KernelPreference = 'auto'): { left: Float32Array; right: Float32Array; kernel: string; events: string[] } {
  const engine = new Engine({ sampleRate: PARITY_RATE, capacity: 64, maxSounds: 256, tuning: defaultTuning, kernel });
  const sounds = scene.sounds.map((s) => engine.addSound(s.channels.map((c) => c.slice()), s.sampleRate));
  const voices = new Map<number, number>();
  const sources: SourceState[] = Array.from({ length: scene.sources }, (_, i) => ({ id: i + 1, position: { x: 0, y: 0, z: 0 } }));
  const left = new Float32Array(scene.frames);
  const right = new Float32Array(scene.frames);
  let next = 0;
  const spatial: { source: number; spatial: SourceSpatial }[] = [];
  const events: string[] = [];
  const drained = new Float64Array(3 * 1024);
  const sceneVoice = (h: number) => [...voices].find(([, v]) => v === h)?.[0];
  for (let f = 0; f < scene.frames; f += QUANTUM) {
    while (next < scene.steps.length && scene.steps[next].frame === f) {
      for (const a of scene.steps[next].actions) {
        if (a.kind === 'play') {
          const h = engine.play(sounds[a.sound], a.source ? { ...a.options, sourceId: a.source } : { ...a.options });
          if (h >= 0) voices.set(a.voice, h);
        } else if (a.kind === 'stop') {
          const h = voices.get(a.voice);
          if (h !== undefined) engine.stop(h, a.fadeSeconds);
        } else if (a.kind === 'set-ratio') {
          const h = voices.get(a.voice);
          if (h !== undefined) engine.setVoice(h, { gain: undefined, ratio: a.ratio });
        } else if (a.kind === 'time-scale') {
          engine.setTimeScale({ target: a.target, rampSeconds: a.ramp, easing: a.easing, startTime: f / PARITY_RATE });
        } else if (a.kind === 'pause') engine.pause(a.group);
        else if (a.kind === 'resume') engine.resume(a.group);
        else if (a.kind === 'group') {
          if (a.volumeDb !== undefined) engine.setGroupVolume(a.group, a.volumeDb);
          if (a.muted !== undefined) engine.setGroupMute(a.group, a.muted);
          if (a.solo !== undefined) engine.setGroupSolo(a.group, a.solo);
        } else if (a.kind === 'seek') {
          const h = voices.get(a.voice);
          if (h !== undefined) engine.seek(h, a.seconds);
        } else if (a.kind === 'spatial') spatial.push(a);
        else {
          // As the runtime does: changed spatial settings go out with the next snapshot, before it.
          for (const sp of spatial.splice(0)) engine.setSourceSpatial(sp.source, sp.spatial);
          for (const s of a.sources) {
            const src = sources[s.id - 1];
            src.position = v(s.position);
            if (s.velocity) src.velocity = v(s.velocity);
          }
          engine.pushSnapshot({
            time: f / PARITY_RATE,
            listener: { position: v(a.listener.position), forward: v(a.listener.forward), up: v(a.listener.up) },
            sources: sources.map((s) => (s.velocity ? { id: s.id, position: v(s.position), velocity: v(s.velocity) } : { id: s.id, position: v(s.position) })),
          });
        }
      }
      next += 1;
    }
    const n = Math.min(QUANTUM, scene.frames - f);
    engine.render([left.subarray(f, f + n), right.subarray(f, f + n)], n);
    const count = engine.drainEvents(drained);
    for (let k = 0; k < count; k++) events.push(`${sceneVoice(drained[3 * k + 1])} ${voiceEventName(drained[3 * k])}`);
  }
  return { left, right, kernel: engine.stats.kernel, events };
}
