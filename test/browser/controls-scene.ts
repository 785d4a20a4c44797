// The scene both hosts render for the controls suite: the parity scene's sounds and fly-by, plus a world pause that
// holds a time-scale ramp, group volume, mute and solo, a seek, a source with its own rolloff and cone, per-play
// variation, a one-shot that ends and a stop — every action at a render-quantum frame.
import { PARITY_RATE, QUANTUM, parityScene, type ParityScene, type SceneAction, type SceneStep } from './parity-scene';

/** The controls scene, `seconds` long (default 1.5 s). */
export function controlsScene(seconds = 1.5): ParityScene {
  const base = parityScene(seconds);
  const steps: SceneStep[] = base.steps.map((st) => ({
    frame: st.frame,
    // Keep the fly-by's snapshots; the voices are this scene's own.
    actions: st.actions.filter((a) => a.kind === 'snapshot'),
  }));
  const at = (seconds: number, ...actions: SceneAction[]) => {
    const f = Math.round((seconds * PARITY_RATE) / QUANTUM) * QUANTUM;
    const s = steps.find((x) => x.frame === f);
    if (s) s.actions.unshift(...actions);
    else steps.push({ frame: f, actions });
  };
  at(0,
    { kind: 'spatial', source: 1, spatial: { refDistance: 2, rolloffFactor: 0.7, coneInnerAngle: 90, coneOuterAngle: 220, coneOuterGain: 0.3, orientation: { x: 1, y: 0, z: 0.4 } } },
    { kind: 'play', voice: 1, sound: 0, options: { group: 'vehicles', loop: true, gain: 0.8 }, source: 1 },
    { kind: 'play', voice: 2, sound: 0, options: { group: 'ambience', loop: true, gain: 0.3, ratio: 0.75 } },
    { kind: 'play', voice: 3, sound: 2, options: { group: 'interface', loop: true, gain: 0.2 } },
  );
  at(0.1, { kind: 'play', voice: 4, sound: 1, options: { group: 'effects', pitchRange: [-300, 300], gainRange: [-6, 0] } });
  at(0.2, { kind: 'group', group: 'ambience', volumeDb: -6 });
  at(0.45, { kind: 'group', group: 'ambience', muted: true });
  at(0.55, { kind: 'time-scale', target: 0.3, ramp: 0.4, easing: 'smooth' });
  at(0.6, { kind: 'pause' });
  at(0.75, { kind: 'group', group: 'ambience', muted: false });
  at(0.9, { kind: 'resume' });
  at(1.0, { kind: 'seek', voice: 1, seconds: 0.3 });
  at(1.1, { kind: 'play', voice: 5, sound: 1, options: { group: 'effects', pitchRange: [-300, 300], gainRange: [-6, 0] } });
  at(1.2, { kind: 'group', group: 'interface', solo: true });
  at(1.3, { kind: 'group', group: 'interface', solo: false }, { kind: 'pause', group: 'vehicles' });
  at(1.35, { kind: 'stop', voice: 2, fadeSeconds: 0.05 });
  steps.sort((a, b) => a.frame - b.frame);
  return { ...base, steps };
}
