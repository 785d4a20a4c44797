// README example: the short three.js + howler integration (type-checked here; the consumer test builds it from the tarball).
import { Howler } from 'howler';
import type { Camera, Object3D } from 'three';
import { HowlerBridge } from '../howler/index';
import { ThreeBinding } from '../three/index';

/** After the first `new Howl` and a click: the camera hears, the drone sounds; start at a low volume. */
export async function startAudio(camera: Camera, drone: Object3D, tuning: unknown) {
  const bridge = new HowlerBridge({ howler: Howler, runtime: { tuning } }); // shares Howler.ctx and its master volume
  const ralenti = await bridge.start();
  const binding = new ThreeBinding({ target: ralenti });
  binding.bindListener(camera);
  const rotor = await bridge.loadSrc(['sounds/rotor.ogg', 'sounds/rotor.mp3']); // the same src as your Howl
  ralenti.play(rotor, { group: 'vehicles', loop: true, source: binding.bindSource(drone) });
  return {
    frame: (ms: number) => binding.update(ms / 1000), // each animation frame, after world matrices update
    slowMotion: (on: boolean) => ralenti.setTimeScale(on ? ralenti.tuning.timeFlow.slowMotionScale : 1),
  };
}
