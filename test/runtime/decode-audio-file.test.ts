// decodeAudioFile's choice of decoder: an OfflineAudioContext at the file's own rate when the header gives one (one per
// rate, reused), the game's context otherwise, and a typed error when neither is available. The Chromium side (88200
// frames for a 2 s loop at 44.1 kHz in a 48 kHz context) is in test/package/consumer.test.ts.
import { afterEach, describe, expect, it } from 'vitest';
import { decodeAudioFile } from '../../runtime/decode-audio-file';
import { RalentiOptionError } from '../../runtime/runtime-error';

/** A 44-byte WAV header (RIFF WAVE, docs/references.md §15a) at `rate`, no samples. */
function wavHeader(rate: number): ArrayBuffer {
  const b = new DataView(new ArrayBuffer(44));
  [...'RIFF'].forEach((c, i) => b.setUint8(i, c.charCodeAt(0)));
  b.setUint32(4, 36, true);
  [...'WAVEfmt '].forEach((c, i) => b.setUint8(8 + i, c.charCodeAt(0)));
  b.setUint32(16, 16, true);
  b.setUint16(20, 1, true);
  b.setUint16(22, 1, true);
  b.setUint32(24, rate, true);
  [...'data'].forEach((c, i) => b.setUint8(36 + i, c.charCodeAt(0)));
  return b.buffer;
}

const made: number[] = [];
class FakeOffline {
  constructor(_channels: number, _length: number, readonly sampleRate: number) {
    if (sampleRate === 7350) throw new Error('NotSupportedError');
    made.push(sampleRate);
  }
  decodeAudioData() {
    return Promise.resolve({ sampleRate: this.sampleRate, via: 'offline' } as unknown as AudioBuffer);
  }
}
const context = { sampleRate: 48000, decodeAudioData: () => Promise.resolve({ sampleRate: 48000, via: 'context' }) } as unknown as BaseAudioContext;
const g = globalThis as { OfflineAudioContext?: unknown };

afterEach(() => {
  delete g.OfflineAudioContext;
});

describe('decodeAudioFile', () => {
  it('decodes at the file\'s own rate with one OfflineAudioContext per rate', async () => {
    g.OfflineAudioContext = FakeOffline;
    made.length = 0;
    for (const rate of [44100, 44100, 22050]) {
      const b = (await decodeAudioFile(wavHeader(rate), { context })) as unknown as { sampleRate: number; via: string };
      expect(b).toEqual({ sampleRate: rate, via: 'offline' });
    }
    expect(made).toEqual([44100, 22050]);
  });

  it.each([
    ['the browser refuses the rate for an OfflineAudioContext', wavHeader(7350)],
    ['the header gives no rate', new Uint8Array([1, 2, 3, 4]).buffer],
  ])('decodes on the given context when %s', async (_why, bytes) => {
    g.OfflineAudioContext = FakeOffline;
    expect(await decodeAudioFile(bytes as ArrayBuffer, { context })).toEqual({ sampleRate: 48000, via: 'context' });
  });

  it('decodes on the given context where there is no OfflineAudioContext (Node)', async () => {
    expect(await decodeAudioFile(wavHeader(44100), { context })).toEqual({ sampleRate: 48000, via: 'context' });
  });

  it('throws a RalentiOptionError naming options.context when it has nothing to decode with', async () => {
    await expect(decodeAudioFile(wavHeader(44100))).rejects.toThrow(RalentiOptionError);
    await expect(decodeAudioFile(wavHeader(44100))).rejects.toThrow(/decodeAudioFile\.context/);
  });
});
