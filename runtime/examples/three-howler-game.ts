// docs/guide.md example: Ralenti in a three.js + howler game (type-checked; docs/guide.md quotes it with package imports).
import type { Camera, Object3D } from 'three';
import { HowlerBridge, type HowlerGlobalLike } from '../howler/index';
import { ThreeBinding } from '../three/index';

/** Call once howler exists (e.g. after the first `new Howl`); start at a low volume, the limiter is on by default. */
export async function startGameAudio(Howler: HowlerGlobalLike, camera: Camera, drone: Object3D, tuning: unknown) {
  const bridge = new HowlerBridge({ howler: Howler, runtime: { tuning } }); // shares Howler.ctx, output into Howler.masterGain
  const ralenti = await bridge.start();
  const binding = new ThreeBinding({ target: ralenti });
  binding.bindListener(camera);
  const rotor = await bridge.loadSrc(['sounds/rotor.ogg', 'sounds/rotor.mp3']); // same src as your Howl, decoded for the engine
  const blast = await bridge.loadSrc(['sounds/blast.ogg', 'sounds/blast.mp3']);
  ralenti.play(rotor, { group: 'vehicles', loop: true, source: binding.bindSource(drone) });
  bridge.onRebuild((fresh) => {
    // After Howler.unload(): same Sound handles, new sources; restart what was playing.
    binding.retarget(fresh);
    fresh.play(rotor, { group: 'vehicles', loop: true, source: binding.bindSource(drone) });
  });

  return {
    /** Once per animation frame, after the scene's world matrices are updated. */
    frame(timestampMs: number): void {
      bridge.check(); // rebuilds after Howler.unload() replaced the context
      binding.update(timestampMs / 1000);
    },
    /** Slow motion on or off: ramps with the tuning's times and easing. */
    slowMotion(on: boolean): void {
      const r = bridge.ralenti;
      if (r) r.setTimeScale(on ? r.tuning.timeFlow.slowMotionScale : 1);
    },
    /** Pause menu: the world holds (a time-scale ramp too) while 'exempt' groups such as interface keep playing. */
    pauseMenu(open: boolean): void {
      if (open) bridge.ralenti?.pause();
      else bridge.ralenti?.resume();
    },
    /** Options menu: a group's volume in dB (gains are in dB throughout the API). */
    groupVolume(group: string, db: number): void {
      bridge.ralenti?.setGroupVolume(group, db);
    },
    /** A one-shot at `at`, a little different each time; its source is unbound once the voice has ended. */
    explode(at: Object3D): void {
      const voice = bridge.ralenti?.play(blast, { group: 'effects', source: binding.bindSource(at), pitchRange: [-150, 150], gainRange: [-3, 0] });
      voice?.on('ended', () => binding.unbindSource(at));
    },
  };
}
