// A dropped audio file as the editor hands it to the page: decoded at the rate it was made at by the runtime's
// decodeAudioFile (an OfflineAudioContext at the rate its header gives), with its name and whether that rate was known.
import { audioFileSampleRate, decodeAudioFile, DECODE_RATE_RANGE } from '../runtime';

/** A decoded file: 1–2 channels at the file's own rate (more channels are cut to the first two). */
export interface DecodedAudioFile {
  readonly name: string;
  readonly channels: Float32Array[];
  /** Sample rate of the decoded data, Hz. */
  readonly sampleRate: number;
  /** True when the header gave the rate; false when the browser decoded at the page's context rate (resampled). */
  readonly ownRate: boolean;
}

/** Decodes `file` at its own rate, or at `context`'s rate when its header is not recognised; rejects when the browser cannot decode it. */
export async function decodeDroppedFile(file: Blob & { name?: string }, context: BaseAudioContext): Promise<DecodedAudioFile> {
  const bytes = await file.arrayBuffer();
  const rate = audioFileSampleRate(new Uint8Array(bytes, 0, Math.min(bytes.byteLength, 1 << 16)));
  const own = rate !== null && rate >= DECODE_RATE_RANGE.min && rate <= DECODE_RATE_RANGE.max;
  const buffer = await decodeAudioFile(bytes, { context });
  const channels: Float32Array[] = [];
  for (let c = 0; c < Math.min(2, buffer.numberOfChannels); c++) channels.push(buffer.getChannelData(c).slice());
  return { name: file.name ?? 'sound', channels, sampleRate: buffer.sampleRate, ownRate: own && buffer.sampleRate === rate };
}
