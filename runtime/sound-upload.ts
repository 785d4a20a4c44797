// What load() uploads: the channels of a sound, validated and copied so the worklet can take them over.
import { RalentiOptionError, checkRange } from './runtime-error';
import type { Sound, SoundData } from './ralenti-types';

/** A sound's channels (copies the caller no longer sees, ready to be transferred), their sample rate in Hz, and its handle. */
export interface SoundUpload {
  channels: Float32Array[];
  sampleRate: number;
  /** The game's handle of the sound (frozen). */
  sound: Sound;
}

/**
 * Copies 1–2 equal, non-empty channels at 1000…768000 Hz out of `data` for the sound with handle `id`; throws
 * RalentiOptionError naming the bad field.
 */
export function soundUpload(data: SoundData, id: number): SoundUpload {
  let channels: Float32Array[];
  let sampleRate: number;
  if (isAudioBuffer(data)) {
    if (!(data.numberOfChannels >= 1 && data.numberOfChannels <= 2))
      throw new RalentiOptionError('load.channels', `expected a mono or stereo AudioBuffer, got ${data.numberOfChannels} channels (downmix it first)`);
    channels = [];
    for (let c = 0; c < data.numberOfChannels; c++) channels.push(data.getChannelData(c).slice());
    sampleRate = data.sampleRate;
  } else {
    if (!Array.isArray(data.channels) || data.channels.length < 1 || data.channels.length > 2)
      throw new RalentiOptionError('load.channels', 'expected 1 or 2 Float32Arrays');
    const n = data.channels[0].length;
    if (n === 0 || data.channels.some((c) => !(c instanceof Float32Array) || c.length !== n))
      throw new RalentiOptionError('load.channels', 'expected Float32Arrays of one non-zero length');
    channels = data.channels.map((c) => c.slice());
    sampleRate = data.sampleRate;
  }
  checkRange('load.sampleRate', sampleRate, 1000, 768000);
  const frames = channels[0].length;
  const sound: Sound = Object.freeze({ id, channels: channels.length, sampleRate, frames, duration: frames / sampleRate });
  return { channels, sampleRate, sound };
}

function isAudioBuffer(d: SoundData): d is AudioBuffer {
  return typeof d === 'object' && d !== null && 'getChannelData' in d && typeof d.getChannelData === 'function';
}
