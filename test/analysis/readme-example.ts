// docs/guide.md's "Pitch analysis" example, kept here so that it is type-checked and run (test/analysis/readme.test.ts).
// README-EXAMPLE-START
import { trackPitch, pitchErrorStats } from '../../src/analysis';

const sampleRate = 48000;
const signal = new Float32Array(sampleRate); // one second of a 440 Hz tone
for (let i = 0; i < signal.length; i++) signal[i] = 0.5 * Math.sin((2 * Math.PI * 440 * i) / sampleRate);

const track = trackPitch(signal, sampleRate, { hopSeconds: 0.01, minHz: 50, maxHz: 2000 });
const expected = track.times.map(() => 440);
const stats = pitchErrorStats(expected, track.frequencies);
console.log(`median ${stats.medianCents} ¢, 95th percentile ${stats.p95Cents} ¢, max ${stats.maxCents} ¢`);
// README-EXAMPLE-END
export { stats };
