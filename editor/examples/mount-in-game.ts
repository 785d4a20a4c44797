// README example: the editor mounted on a game's own page (type-checked; the README quotes it with package imports).
import { createRalenti, type RalentiSource } from '../../runtime/index';
import { mountEditor } from '../index';

/** In a development build: the game's runtime, then one call for the panel, its readouts named after the game's sources. */
export async function startWithEditor(context: AudioContext, cart: RalentiSource, door: RalentiSource, dev: boolean): Promise<void> {
  const ralenti = await createRalenti(context);
  ralenti.connect(context.destination);
  // … the game loads its tuning and sounds, creates its sources and plays its voices …
  if (dev) mountEditor(ralenti, { names: { sources: [[cart, 'mine cart'], [door, 'vault door']] } });
}
