// Dropping an audio file on the panel: on a readout row it replaces that voice's sound; elsewhere, the sound of the
// first playing voice of the selected group. The file is decoded at its own rate; the page does the replacing.
import type { VoiceMonitor } from '../src';
import type { Announcer } from './controls/announcer';
import { decodeDroppedFile, type DecodedAudioFile } from './decode-audio-file';

/** Replaces the sound of voice `voiceId` with `sound`; resolves with the name the readouts now show. */
export type ReplaceSound = (voiceId: number, sound: DecodedAudioFile) => Promise<string> | string;

/** Decodes `file` (at its own rate; else at `context`'s) and hands it to `replace` for `voiceId`, saying what happened; resolves with the new name or null. */
export async function dropSound(file: File, voiceId: number, context: BaseAudioContext, replace: ReplaceSound, notice: Announcer): Promise<string | null> {
  let decoded: DecodedAudioFile;
  try {
    decoded = await decodeDroppedFile(file, context);
  } catch (err) {
    notice.say(`${file.name}: the browser could not decode it (${(err as Error)?.message ?? err}).`, 'warn');
    return null;
  }
  try {
    const name = await replace(voiceId, decoded);
    const rate = decoded.ownRate ? `decoded at its own ${decoded.sampleRate} Hz` : `header not recognised: decoded at ${decoded.sampleRate} Hz`;
    notice.say(`${name}: now plays ${file.name} (${rate}).`);
    return name;
  } catch (err) {
    notice.say(`${file.name}: not used (${(err as Error)?.message ?? err}).`, 'warn');
    return null;
  }
}

/** Drop handling on the panel's container. */
export class SoundDropTarget {
  private readonly element: HTMLElement;
  private readonly off: () => void;

  constructor(element: HTMLElement, context: BaseAudioContext, replace: ReplaceSound | null, notice: Announcer, selectedGroup: () => string, voices: () => readonly VoiceMonitor[]) {
    this.element = element;
    const over = (e: DragEvent) => {
      if (!replace || !e.dataTransfer?.types.includes('Files')) return;
      e.preventDefault();
      element.classList.add('rl-dropping');
    };
    const leave = () => element.classList.remove('rl-dropping');
    const drop = (e: DragEvent) => {
      leave();
      const file = e.dataTransfer?.files?.[0];
      if (!replace || !file) return;
      e.preventDefault();
      const row = (e.target as HTMLElement | null)?.closest?.('tr[data-voice]') as HTMLElement | null;
      const group = selectedGroup();
      const id = row ? Number(row.dataset.voice) : (voices().find((v) => v.group === group && v.voice > 0)?.voice ?? -1);
      if (id < 0) return notice.say(`${file.name}: drop it on a voice in the readouts (no voice of ${group} is playing).`, 'warn');
      void dropSound(file, id, context, replace, notice);
    };
    element.addEventListener('dragover', over);
    element.addEventListener('dragleave', leave);
    element.addEventListener('drop', drop);
    this.off = () => {
      element.removeEventListener('dragover', over);
      element.removeEventListener('dragleave', leave);
      element.removeEventListener('drop', drop);
    };
  }

  /** Removes the listeners. */
  dispose(): void {
    this.off();
    this.element.classList.remove('rl-dropping');
  }
}
