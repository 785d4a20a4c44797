// Pitch tracker speed: 30 s of a swept harmonic tone at 48 kHz, tracked with and without the band-limited refinement,
// against a reference measured in the same run: YIN with the direct O(W·maxLag) difference function.
import { PitchTracker, YinEstimator } from '../src/analysis';

const sampleRate = 48000;
const seconds = 30;

function sweptTone(): Float32Array {
  const x = new Float32Array(sampleRate * seconds);
  let phase = 0;
  for (let i = 0; i < x.length; i++) {
    const f = 300 * (1 + 0.1 * Math.sin((2 * Math.PI * i) / (sampleRate * 7)));
    phase += (2 * Math.PI * f) / sampleRate;
    x[i] = 0.4 * Math.sin(phase) + 0.2 * Math.sin(2 * phase + 1) + 0.1 * Math.sin(3 * phase + 2);
  }
  return x;
}

/** Direct difference function and the same YIN steps 3–4 for one frame (reference cost only). */
function directFrame(x: Float32Array, offset: number, w: number, maxLag: number, d: Float64Array): number {
  for (let tau = 1; tau <= maxLag; tau++) {
    let sum = 0;
    for (let j = 0; j < w; j++) {
      const e = x[offset + j] - x[offset + j + tau];
      sum += e * e;
    }
    d[tau] = sum;
  }
  let acc = 0;
  let best = 1;
  let bestValue = Infinity;
  for (let tau = 1; tau <= maxLag; tau++) {
    acc += d[tau];
    const v = (d[tau] * tau) / acc;
    if (v < bestValue) {
      bestValue = v;
      best = tau;
    }
  }
  return best;
}

/** Runs the benchmark; returns seconds per run, real-time factors and the speed-up over the direct reference. */
export async function run(options: { json: boolean }): Promise<object> {
  const x = sweptTone();
  const time = (f: () => void) => {
    const t0 = performance.now();
    f();
    return (performance.now() - t0) / 1000;
  };
  const refined = new PitchTracker({ sampleRate });
  const plain = new PitchTracker({ sampleRate, refine: false });
  refined.track(x.subarray(0, sampleRate)); // warm-up
  const frames = refined.frameCount(x.length);
  const refinedSeconds = time(() => refined.track(x));
  const plainSeconds = time(() => plain.track(x));
  const yin = new YinEstimator({ sampleRate });
  const d = new Float64Array(yin.maxLag + 1);
  const sampleFrames = 60;
  const directSeconds =
    (time(() => {
      for (let i = 0; i < sampleFrames; i++) directFrame(x, i * refined.hopFrames, yin.windowFrames, yin.maxLag, d);
    }) /
      sampleFrames) *
    frames;
  const result = {
    audioSeconds: seconds,
    frames,
    refinedSeconds: +refinedSeconds.toFixed(3),
    plainSeconds: +plainSeconds.toFixed(3),
    directReferenceSeconds: +directSeconds.toFixed(3),
    realTimeFactorRefined: +(seconds / refinedSeconds).toFixed(1),
    speedUpOverDirect: +(directSeconds / refinedSeconds).toFixed(1),
  };
  if (!options.json) {
    console.log('| tracker | seconds for 30 s of audio | × real time |');
    console.log('| --- | --- | --- |');
    console.log(`| YIN, FFT difference, refined | ${result.refinedSeconds} | ${result.realTimeFactorRefined} |`);
    console.log(`| YIN, FFT difference, paper steps only | ${result.plainSeconds} | ${(seconds / plainSeconds).toFixed(1)} |`);
    console.log(`| reference: direct difference (extrapolated from ${sampleFrames} frames) | ${result.directReferenceSeconds} | ${(seconds / directSeconds).toFixed(1)} |`);
    console.log(`speed-up of the refined tracker over the direct reference: ${result.speedUpOverDirect}×`);
  }
  return result;
}
