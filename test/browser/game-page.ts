// A page that is not the sample scene: a tiny "game" that makes its own AudioContext and Ralenti, plays a sound on a
// moving source, and mounts the editor with one call. The test bundles it against the built entries (dist/runtime.js
// for `ralenti/runtime`, dist/editor.js for `ralenti/editor`); the source imports type-check against the sources.
import { createRalenti } from '../../runtime/index';
import { mountEditor, type MountedEditor } from '../../editor/index';

declare global {
  interface Window {
    game: { ready: boolean; error: string | null; editor: MountedEditor | null; tuningJson(): string };
  }
}

window.game = { ready: false, error: null, editor: null, tuningJson: () => '' };

async function start(): Promise<void> {
  const context = new AudioContext();
  await context.resume();
  const ralenti = await createRalenti(context, { workletUrl: '/ralenti-processor.js' });
  ralenti.connect(context.destination);
  const rate = context.sampleRate;
  const hum = new Float32Array(rate).map((_, i) => 0.2 * Math.sin((2 * Math.PI * 110 * i) / rate));
  const sound = ralenti.load({ channels: [hum], sampleRate: rate });
  const cart = ralenti.createSource();
  ralenti.play(sound, { group: 'vehicles', loop: true, source: cart });
  const editor = mountEditor(ralenti, { names: { sources: [[cart, 'mine cart']] } });
  let t = 0;
  const frame = () => {
    t += 1 / 60;
    cart.setPosition(20 * Math.sin(t * 0.5), 0, -5);
    ralenti.update();
    requestAnimationFrame(frame);
  };
  requestAnimationFrame(frame);
  window.game = { ready: true, error: null, editor, tuningJson: () => JSON.stringify(ralenti.tuning) };
}

document.getElementById('play')!.addEventListener('click', () => {
  start().catch((e) => (window.game.error = String(e?.message ?? e)));
});
