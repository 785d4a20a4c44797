// Decodes a dropped audio file at the rate it was made at: the header gives the rate, and an OfflineAudioContext at
// that rate decodes it (decodeAudioData resamples to its context's rate, so a context at the file's own rate does not).
import { readAudioFileRate, type AudioFileRate } from './audio-file-rate';

/** A decoded file: 1–2 channels at the file's own rate (more channels are cut to the first two). */
export interface DecodedAudioFile {
  readonly name: string;
  readonly channels: Float32Array[];
  /** Sample rate of the decoded data, Hz. */
  readonly sampleRate: number;
  /** True when the header gave the rate; false when the browser decoded at `fallbackRate` (resampled). */
  readonly ownRate: boolean;
  readonly format: AudioFileRate['format'];
}

/** Decodes `file`; `fallbackRate` (Hz) is used when the header is not recognised. Rejects when the browser cannot decode it. */
export async function decodeAudioFile(file: Blob & { name?: string }, fallbackRate: number): Promise<DecodedAudioFile> {
  const bytes = await file.arrayBuffer();
  const header = readAudioFileRate(new Uint8Array(bytes, 0, Math.min(bytes.byteLength, 1 << 16)));
  const own = header.sampleRate !== null && header.sampleRate >= 3000 && header.sampleRate <= 768000;
  const rate = own ? header.sampleRate! : fallbackRate;
  const ctx = new OfflineAudioContext({ numberOfChannels: 1, length: 1, sampleRate: rate });
  const buffer = await ctx.decodeAudioData(bytes);
  const channels: Float32Array[] = [];
  for (let c = 0; c < Math.min(2, buffer.numberOfChannels); c++) channels.push(buffer.getChannelData(c).slice());
  return { name: file.name ?? 'sound', channels, sampleRate: buffer.sampleRate, ownRate: own, format: header.format };
}
