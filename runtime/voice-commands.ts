// The messages behind a voice handle's calls (stop, seek, gain, ratio): checked on the main thread, then sent.
import { dbToGain } from '../src/dsp/index';
import type { Decibels, Seconds } from '../src/index';
import type { Command } from './protocol';
import type { VoiceHandle, VoiceHandleHost } from './ralenti-voice';
import { RalentiOptionError, checkRange } from './runtime-error';

/** What the voice calls need from their runtime. */
export interface VoiceCommandsOptions {
  /** Context time now, s. */
  now: () => Seconds;
  /** Throws RalentiClosedError naming call `what` once the runtime is closed. */
  alive: (what: string) => void;
  send: (c: Command) => void;
}

/** The host of a runtime's voice handles: each call checks the runtime is open and its arguments, then sends. */
export function voiceCommands(o: VoiceCommandsOptions): VoiceHandleHost {
  return {
    now: o.now,
    stop: (h: VoiceHandle, fade: Seconds | undefined) => {
      o.alive('stop');
      if (fade !== undefined) checkRange('stop.fade', fade, 0, 60);
      o.send({ type: 'stop', voice: h.id, fadeSeconds: fade });
    },
    seek: (h: VoiceHandle, seconds: Seconds) => {
      o.alive('seek');
      o.send({ type: 'seek', voice: h.id, seconds });
    },
    setGain: (h: VoiceHandle, db: Decibels) => {
      o.alive('setGain');
      o.send({ type: 'set-voice', voice: h.id, gain: dbToGain(checkRange('setGain.db', db, -120, 24)) });
    },
    setRatio: (h: VoiceHandle, ratio: number) => {
      o.alive('setRatio');
      o.send({ type: 'set-voice', voice: h.id, ratio: checkRatio('setRatio.ratio', ratio) });
    },
  };
}

function checkRatio(field: string, ratio: number): number {
  checkRange(field, ratio, 0, 4);
  if (ratio <= 0) throw new RalentiOptionError(field, 'expected a ratio above 0');
  return ratio;
}
