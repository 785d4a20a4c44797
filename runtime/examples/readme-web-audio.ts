// README example: Ralenti on plain Web Audio, no howler and no three (type-checked here and in the consumer test).
import { createRalenti, decodeAudioFile } from '../inline';

/** Call from a click (browsers start audio only after a gesture); start at a low volume, the limiter is on. */
export async function startSiren(url: string) {
  const ctx = new AudioContext();
  const ralenti = await createRalenti(ctx); // the built-in tuning; pass { tuning } for yours
  ralenti.connect(ctx.destination);
  const bytes = await (await fetch(url)).arrayBuffer();
  const siren = ralenti.load(await decodeAudioFile(bytes)); // decoded at the file's own sample rate
  const car = ralenti.createSource().setPosition(-60, 0, -5);
  ralenti.setListener({ position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } });
  ralenti.play(siren, { group: 'vehicles', loop: true, source: car });
  const frame = (seconds: number) => { car.setPosition(-60 + 30 * seconds, 0, -5); ralenti.update(); }; // a 30 m/s pass
  return { ralenti, frame }; // call frame(seconds) each animation frame; ralenti.setTimeScale(0.25) slows it
}
