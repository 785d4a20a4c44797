// The measurement of the message-allocation check (message-allocation.test.ts builds and spawns it in its own
// `node --expose-gc` process; method as test/engine/allocation-probe.ts, docs/allocation.md). The messages a game sends
// every frame — a snapshot (source counts cycling across every list band of the decoder, with and without velocities),
// a voice's gain and ratio (set-voice) and a time-scale ramp — are each already a structured clone, as the port
// delivers them: what is counted is what the audio thread allocates on top of the message. Prints one JSON line.
import { gc, spanMeter } from '../engine/heap-span';
import { EngineHost } from '../../runtime/worklet/engine-host';
import { SnapshotDecoder, decodeCommand, decodeSnapshot, encodeSnapshot, type Command } from '../../runtime/protocol';
import { defaultTuning } from '../../src/tuning/index';
import type { EngineSnapshot } from '../../src/index';

/** Frames of messages (three per frame) for each warm-up round and for each measurement, in spans of SPAN_FRAMES. */
const WARM_UP_FRAMES = 3000;
const MEASURED_FRAMES = 3000;
const SPAN_FRAMES = 50;
/** Source slots of the host, and the source counts its snapshots cycle through (every band: 0, ≤16, ≤48, ≤112, ≤128). */
export const PROBE_MAX_SOURCES = 128;
const COUNTS = [8, 3, 40, 8, 0, 128, 1, 100, 16, 17, 49, 113];
const RATE = 48000;

/** Average bytes allocated per message, by what handled it. */
export interface MessageAllocationReport {
  /** A snapshot's shape check and its decode into the host's SnapshotDecoder (the host's own part of a snapshot). */
  decode: number;
  /** The same through decodeSnapshot, a fresh object per message (the path before the decoder): shows the check can see allocation. */
  decodeFresh: number;
  /** EngineHost.handle of a set-voice command, and of a time-scale command (the host and the engine). */
  setVoice: number;
  timeScale: number;
  /** EngineHost.handle of a snapshot: the decode plus the engine's push (its snapshot path: docs/allocation.md). */
  snapshot: number;
  /** Collections that started inside a measured span (each would hide allocation). */
  collections: number;
  /** Errors the host counted (a malformed probe message would show here). */
  errors: number;
}

/** One frame's three messages, cloned as postMessage clones them. */
function frameMessages(frame: number): Command[] {
  const n = COUNTS[frame % COUNTS.length];
  const t = frame / 60;
  const snapshot: EngineSnapshot = {
    time: t,
    listener: { position: { x: 0.1 * frame, y: 1.5, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 }, velocity: frame % 2 === 0 ? { x: 6, y: 0, z: 0 } : undefined },
    sources: Array.from({ length: n }, (_, i) => ({
      id: i + 1,
      position: { x: 10 * Math.cos(t + i), y: 0.5, z: 10 * Math.sin(t + i) },
      velocity: i % 3 === 0 ? { x: -10 * Math.sin(t + i), y: 0, z: 10 * Math.cos(t + i) } : undefined,
    })),
  };
  const messages: Command[] = [
    { type: 'snapshot', data: encodeSnapshot(snapshot) },
    { type: 'set-voice', voice: 1 + (frame % 8), gain: 0.5 + 0.25 * Math.sin(t), ratio: 1 + 0.1 * Math.cos(t) },
    { type: 'time-scale', request: { target: frame % 2 === 0 ? 0.35 : 1, rampSeconds: 0.25, easing: 'smooth', startTime: t } },
  ];
  return messages.map((m) => structuredClone(m));
}

async function main(): Promise<void> {
  if (gc === undefined) throw new Error('run with node --expose-gc');
  const { across, stop } = spanMeter();

  const host = new EngineHost({
    sampleRate: RATE, startContextTime: 0, post: () => {},
    processorOptions: { capacity: 16, maxSounds: 4, tuning: defaultTuning, statsIntervalSeconds: 10, maxSources: PROBE_MAX_SOURCES },
  });
  const tone = new Float32Array(RATE).map((_, i) => 0.2 * Math.sin((2 * Math.PI * 220 * i) / RATE));
  host.handle({ type: 'add-sound', sound: 1, channels: [tone], sampleRate: RATE });
  for (let v = 1; v <= 8; v++) host.handle({ type: 'play', voice: v, sound: 1, options: { loop: true, sourceId: v, group: v % 2 === 0 ? 'vehicles' : 'effects' } });
  const decoder = new SnapshotDecoder(PROBE_MAX_SOURCES);
  const out = [new Float32Array(128), new Float32Array(128)];
  let frame = 0;
  let sink = 0;
  const batch = (frames: number): Command[][] => {
    const b: Command[][] = [];
    for (let f = 0; f < frames; f++) b.push(frameMessages(frame++));
    return b;
  };
  // Each way of handling, over one span's messages. Indexed loops: these run once per span, unoptimised, where a for-of
  // would allocate its iterator results.
  const ways = {
    decode: (b: Command[][]) => {
      for (let f = 0; f < b.length; f++) {
        const c = decodeCommand(b[f][0]);
        if (typeof c !== 'string' && c.type === 'snapshot') sink += decoder.decode(c.data, 0.5)!.sources.length;
      }
    },
    decodeFresh: (b: Command[][]) => {
      for (let f = 0; f < b.length; f++) {
        const c = decodeCommand(b[f][0]);
        if (typeof c !== 'string' && c.type === 'snapshot') sink += decodeSnapshot(c.data, 0.5)!.sources.length;
      }
    },
    setVoice: (b: Command[][]) => {
      for (let f = 0; f < b.length; f++) host.handle(b[f][1]);
    },
    timeScale: (b: Command[][]) => {
      for (let f = 0; f < b.length; f++) host.handle(b[f][2]);
    },
    snapshot: (b: Command[][]) => {
      for (let f = 0; f < b.length; f++) host.handle(b[f][0]);
    },
  };
  const names = Object.keys(ways) as (keyof typeof ways)[];
  // Warm-up, rendering between frames as the audio thread does, twice with a full collection between. The host gets
  // each frame's messages through the measured functions themselves, so that V8 has optimised them before the
  // measurement: their compiled code is allocated on the heap, and would count in the span where it lands.
  for (let round = 0; round < 2; round++) {
    for (let f = 0; f < WARM_UP_FRAMES; f += SPAN_FRAMES) {
      const b = batch(SPAN_FRAMES);
      ways.decode(b);
      ways.decodeFresh(b);
      for (let k = 0; k < b.length; k++) {
        const frameOnly = [b[k]];
        ways.snapshot(frameOnly);
        ways.setVoice(frameOnly);
        ways.timeScale(frameOnly);
        for (let q = 0; q < 6; q++) host.process(out);
      }
    }
    gc({ type: 'major' });
  }
  const spans = names.map(() => [] as Command[][][]);
  for (let f = 0; f < MEASURED_FRAMES; f += SPAN_FRAMES) for (const s of spans) s.push(batch(SPAN_FRAMES));
  gc({ type: 'major' });
  const nothing = () => {};
  await across(nothing);
  const overhead = await across(nothing);
  const report: MessageAllocationReport = { decode: 0, decodeFresh: 0, setVoice: 0, timeScale: 0, snapshot: 0, collections: overhead.collections, errors: 0 };
  for (let w = 0; w < names.length; w++) {
    let bytes = 0;
    for (const b of spans[w]) {
      const m = await across(() => ways[names[w]](b));
      bytes += m.bytes - overhead.bytes;
      report.collections += m.collections;
    }
    report[names[w]] = bytes / MEASURED_FRAMES;
  }
  stop();
  report.errors = host.errors + host.engine.stats.errors + (sink < 0 ? 1 : 0);
  process.stdout.write(`${JSON.stringify(report)}\n`);
}

void main();
