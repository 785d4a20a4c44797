// createRalenti: loads the worklet module, builds the node, and resolves once the engine runs on the audio thread.
import { parseTuning, defaultTuning } from '../src/tuning/index';
import { packAllTiers, packKernelTable, wasmSimdSupported } from '../src/dsp/index';
import { PROCESSOR_NAME, type ProcessorOptions, type Report } from './protocol';
import { Ralenti } from './ralenti';
import { RalentiOptionError, checkInteger, checkRange } from './runtime-error';
import { defaultWorkletUrl } from './worklet-url';

/** Options of createRalenti. */
export interface CreateRalentiOptions {
  /** A tuning document (JSON value); validated here, throws TuningError. Default: the built-in tuning. */
  tuning?: unknown;
  /** Voice pool size, 1…1024 (default 64). */
  capacity?: number;
  /** Sound slots, 1…4096 (default 256). */
  maxSounds?: number;
  /** URL of the bundled processor (dist/ralenti-processor.js); default: next to this module. */
  workletUrl?: string | URL;
  /** Interval between stats reports, 0.05…10 s (default 0.25). */
  statsIntervalSeconds?: number;
  /** Source slots, 1…4096 (default 256): update() sends at most this many sources, those with voices first. */
  maxSources?: number;
  /** Groups of the tuning that get their own output node (`groupOutput(group)`), at most 8 (default none). */
  groupOutputs?: string[];
  /** Seed of the per-play pitch and gain variation, an integer 0…2³²−1 (default 1): the same seed replays the same variation. */
  seed?: number;
}

/** Frozen defaults of CreateRalentiOptions. */
export const createRalentiDefaults = Object.freeze({ capacity: 64, maxSounds: 256, statsIntervalSeconds: 0.25, maxSources: 256, seed: 1 });

const loaded = new WeakMap<BaseAudioContext, Map<string, Promise<void>>>();

/** Adds the worklet module to the context once per URL. */
function addModuleOnce(context: BaseAudioContext, url: string): Promise<void> {
  let perContext = loaded.get(context);
  if (!perContext) loaded.set(context, (perContext = new Map()));
  let p = perContext.get(url);
  if (!p) {
    p = context.audioWorklet.addModule(url);
    p.catch(() => perContext.delete(url));
    perContext.set(url, p);
  }
  return p;
}

/**
 * Creates the runtime on `context`: validates options (throws RalentiOptionError or TuningError), loads the
 * processor module, builds a stereo AudioWorkletNode, and resolves when the engine reports ready.
 * The node is not connected: call `connect(context.destination)` or route it into your own bus.
 */
export async function createRalenti(context: BaseAudioContext, options: CreateRalentiOptions = {}): Promise<Ralenti> {
  const capacity = checkInteger('createRalenti.capacity', options.capacity ?? createRalentiDefaults.capacity, 1, 1024);
  const maxSounds = checkInteger('createRalenti.maxSounds', options.maxSounds ?? createRalentiDefaults.maxSounds, 1, 4096);
  const statsIntervalSeconds = checkRange(
    'createRalenti.statsIntervalSeconds', options.statsIntervalSeconds ?? createRalentiDefaults.statsIntervalSeconds, 0.05, 10);
  const tuning = options.tuning === undefined ? defaultTuning : parseTuning(options.tuning);
  const maxSources = checkInteger('createRalenti.maxSources', options.maxSources ?? createRalentiDefaults.maxSources, 1, 4096);
  const seed = checkInteger('createRalenti.seed', options.seed ?? createRalentiDefaults.seed, 0, 2 ** 32 - 1);
  const groupOutputs = [...new Set(options.groupOutputs ?? [])];
  if (groupOutputs.length > 8) throw new RalentiOptionError('createRalenti.groupOutputs', `at most 8 groups, got ${groupOutputs.length}`);
  for (const g of groupOutputs)
    if (typeof g !== 'string' || !Object.prototype.hasOwnProperty.call(tuning.groups, g))
      throw new RalentiOptionError('createRalenti.groupOutputs', `unknown group "${String(g)}" (tuning has: ${Object.keys(tuning.groups).join(', ')})`);
  if (!context || !context.audioWorklet) throw new RalentiOptionError('createRalenti.context', 'expected a BaseAudioContext with audioWorklet (secure context)');
  const url = String(options.workletUrl ?? defaultWorkletUrl());
  await addModuleOnce(context, url);
  // Kernel tables are designed here, off the audio thread: the tuning tier's with its WebAssembly layout (other tiers
  // follow when a tuning asks for them); without SIMD every tier's samples at once (there is no layout to copy in).
  const tier = tuning.resampler.tier;
  const simd = wasmSimdSupported();
  const tables = simd ? [packKernelTable(tier, context.sampleRate, true)] : packAllTiers(context.sampleRate, null);
  const processorOptions: ProcessorOptions = { capacity, maxSounds, tuning, statsIntervalSeconds, tables, maxSources, groupOutputs, seed };
  const node = new AudioWorkletNode(context, PROCESSOR_NAME, {
    numberOfInputs: 0,
    numberOfOutputs: 1 + groupOutputs.length,
    outputChannelCount: [2, ...groupOutputs.map(() => 2)],
    processorOptions,
  });
  const ready = new Promise<void>((resolve, reject) => {
    node.port.onmessage = (e: MessageEvent) => {
      const r = e.data as Report;
      if (r?.type === 'ready') resolve();
      else if (r?.type === 'error' && r.where === 'construct') reject(new Error(`ralenti processor: ${r.message}`));
    };
    node.onprocessorerror = () => reject(new Error('ralenti processor failed to start'));
  });
  await ready;
  return new Ralenti({ context, node, tuning, capacity, maxSources, groupOutputs, tableTiers: simd ? [tier] : tables.map((t) => t.table.name) });
}
