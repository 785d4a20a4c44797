// Decodes an audio file at its own sample rate, so that the engine's band-limited resampler is the only one between
// the file and the speakers: an OfflineAudioContext at the rate read from the header decodes without resampling.
import { audioFileSampleRate } from './audio-file-rate';
import { RalentiOptionError } from './runtime-error';

/** Options of decodeAudioFile. */
export interface DecodeAudioFileOptions {
  /** Context to decode with when the file's rate is unknown (AAC/MP4, WebM) or unsupported; the browser then resamples to its rate. */
  context?: BaseAudioContext;
}

/** Lowest and highest rates an OfflineAudioContext is tried at, Hz (Chromium accepts 3000…768000). */
export const DECODE_RATE_RANGE = Object.freeze({ min: 3000, max: 768000 });

/** One decoding context per rate, reused for every file at that rate (they never render). */
const decoders = new Map<number, OfflineAudioContext>();

/**
 * Decodes `bytes` (WAV, FLAC, Ogg Vorbis/Opus, MP3: at the file's own rate; other formats: at `context`'s rate).
 * The buffer is detached by the browser's decoder; rejects with the browser's error for undecodable data.
 */
export async function decodeAudioFile(bytes: ArrayBuffer, options: DecodeAudioFileOptions = {}): Promise<AudioBuffer> {
  const rate = audioFileSampleRate(bytes);
  const Offline = (globalThis as { OfflineAudioContext?: typeof OfflineAudioContext }).OfflineAudioContext;
  if (rate !== null && Offline && rate >= DECODE_RATE_RANGE.min && rate <= DECODE_RATE_RANGE.max) {
    let own = decoders.get(rate) ?? null;
    if (!own) {
      try {
        own = new Offline(1, 1, rate);
        decoders.set(rate, own);
      } catch {
        own = null; // a rate this browser refuses: decode at the context's rate below
      }
    }
    if (own) return own.decodeAudioData(bytes);
  }
  if (!options.context) {
    throw new RalentiOptionError('decodeAudioFile.context', 'the file\'s sample rate is unknown here (not WAV, FLAC, Ogg or MP3, or no OfflineAudioContext); pass options.context to decode at its rate');
  }
  return options.context.decodeAudioData(bytes);
}
