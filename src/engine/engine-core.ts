// The engine's parts, built once at construction (voices, pool, sound bank, snapshots, time flow, mapper, buses,
// propagation, scratch), with the engine clock, clamp counter and the mapping of one voice's targets; the concept
// files (voice-start, block-render, engine-tuning, engine-monitor) act on it, `Engine` is its public face.
import type { Hz, Seconds, Vec3Like } from '../units';
import type { EngineOptions, EngineStats } from './engine-types';
import { AirAbsorption } from '../motion';
import { defaultTuning, DEFAULT_GROUP, type Tuning } from '../tuning';
import { KernelTable, WasmKernel, aliasStopFraction, dbToGain } from '../dsp';
import { TargetMapper, TimeFlow, createVoiceTargets, type SourceState, type TimeScaleRequest, type VoiceInput, type VoiceTargets } from '../dilation';
import { seededRandom } from '../random';
import { PropagationStage } from './propagation-stage';
import { SoundBank } from './sound-bank';
import { SnapshotStore } from './snapshot-store';
import { MasterBus } from './master-bus';
import { KernelResidency } from './kernel-residency';
import { VoicePool } from './voice-pool';
import { checkRange } from './engine-values';
import { StretchBank } from './stretch-stage';
import { Voice, type VoiceScratch } from './voice';
import { VoiceControls } from './voice-controls';
import { VoiceEventRing } from './voice-events';
import { GroupRoutes } from './group-routes';
import { propagationSpeed, smoothingOf } from './engine-tuning';
import { BlockClock } from './block-clock';

/** Frozen defaults of the engine's options and fades. */
export const engineDefaults = Object.freeze({
  capacity: 64,
  maxSounds: 256,
  maxBlockFrames: 128,
  maxSources: 256,
  /** Voices of 'stretch' groups that can play at once (more play tape-style, counted in clamps). */
  maxStretchVoices: 32,
  /** Default fade-in of a voice, s. */
  fadeInSeconds: 0.003,
  /** Default fade-out of `stop`, s. */
  stopFadeSeconds: 0.01,
  /** Fade-out of a stolen voice, s. */
  stealFadeSeconds: 0.01,
});

/** A source state with a velocity, as the mapper reads it. */
export type MovingSource = SourceState & { velocity: Vec3Like };

/** Everything an engine holds; shared by the engine's concept files (not exported from the folder). */
export class EngineCore {
  /** Output sample rate, Hz. */
  readonly sampleRate: Hz;
  /** Voices that may play at once. */
  readonly capacity: number;
  /** Largest block rendered in one step, frames. */
  readonly maxBlock: number;
  /** Every voice slot (2 × capacity: playing and fading). */
  readonly voices: Voice[] = [];
  /** Handles, stealing, release and free of the voice slots. */
  readonly pool: VoicePool;
  /** Decoded sounds. */
  readonly bank: SoundBank;
  /** Listener and source positions from snapshots. */
  readonly snapshots: SnapshotStore;
  /** The time scale and its ramps. */
  readonly flow = new TimeFlow();
  /** Group curves and Doppler: gameplay state → voice targets. */
  readonly mapper: TargetMapper;
  /** Master gain, blast guard and limiter. */
  readonly bus: MasterBus;
  /** Scratch buffers every voice renders through. */
  readonly scratch: VoiceScratch;
  /** Time-stretch stages lent to 'stretch' voices. */
  readonly stretches: StretchBank;
  /** Module-memory bookkeeping when the voices run on the WebAssembly kernel, else null (TypeScript kernel). */
  readonly resident: KernelResidency | null;
  /** Emission-time solutions, per-sample ratios and shockwaves of moving sources. */
  readonly stage: PropagationStage;
  /** Air absorption (ISO 9613-1) by distance. */
  readonly air: AirAbsorption;
  /** Group buses, pause, seeks and source spatial settings per voice slot. */
  readonly controls: VoiceControls;
  /** Voice events for the host. */
  readonly events = new VoiceEventRing();
  /** Routed group outputs. */
  readonly routes: GroupRoutes;
  /** Seeded generator of the per-play variation. */
  readonly random: () => number;
  /** Counters and levels (the same object throughout). */
  readonly stats: EngineStats;
  /** Targets of a voice about to start (the stealing decision, then copied into the voice). */
  readonly probe: VoiceTargets = createVoiceTargets();
  /** Emission-time state of a propagating voice's source, handed to the mapper (velocity 0: the Doppler is in the read). */
  /** The engine clock of the block being rendered, handed to the voices' stages (allocation-free). */
  readonly clock: BlockClock;
  readonly emission: MovingSource = { id: 0, position: { x: 0, y: 0, z: 0 }, velocity: { x: 0, y: 0, z: 0 } };
  /** Tables handed in by the host (by tier name), or null: the engine designs its own (`KernelTable.forTier`). */
  readonly given: Map<string, KernelTable> | null;
  /** The tuning in use. */
  tuning: Tuning;
  /** The resampler table in use. */
  table: KernelTable;
  /** Frames rendered so far. */
  frameCount = 0;
  /** Start order of the next voice. */
  sequence = 0;
  /** Clamps counted by the engine itself (unknown groups, bad values). */
  clamps = 0;
  /** Linear ceiling of the routed outputs. */
  routeCeiling = 1;
  /** The mapper's input, filled field by field (the render loop writes it in place: no doubles cross a call). */
  readonly input: VoiceInput;
  /**
   * The requests the render calls read in turn (and do not apply), in the two common shapes (without and with a start
   * time), their numbers doubles, so that the render code is optimised with type feedback for both before a request
   * comes (see `takeTimeScale` in block-render). Objects of the same shape share V8's layout: a field that held
   * `undefined` here would make every later store of a double into a caller's request box it.
   */
  readonly restingRequests: readonly TimeScaleRequest[] = [
    { target: 0.5, rampSeconds: 0.5, easing: 'linear' },
    { target: 0.5, rampSeconds: 0.5, easing: 'linear', startTime: 0.5 },
  ];
  /** The time-scale request the next render call reads: one of `restingRequests`, or one `Engine.setTimeScale` hands over. */
  timeRequest: TimeScaleRequest = this.restingRequests[0];
  /** Render calls so far (which resting request the next one reads). */
  renderCalls = 0;
  /** True while `Engine.setTimeScale` has the render code apply `timeRequest` (and render nothing). */
  timePending = false;

  /** Builds every voice, buffer and table up front; throws RangeError naming a bad option. */
  constructor(options: EngineOptions, owner: object) {
    const sr = options.sampleRate;
    if (!(sr >= 8000 && sr <= 192000)) throw new RangeError(`EngineOptions.sampleRate must be 8000…192000 Hz, got ${sr}`);
    this.sampleRate = sr;
    this.clock = new BlockClock(sr);
    this.capacity = checkRange('capacity', options.capacity ?? engineDefaults.capacity, 1, 1024);
    this.maxBlock = checkRange('maxBlockFrames', options.maxBlockFrames ?? engineDefaults.maxBlockFrames, 1, 16384);
    const maxSources = checkRange('maxSources', options.maxSources ?? engineDefaults.maxSources, 1, 4096);
    this.bank = new SoundBank(checkRange('maxSounds', options.maxSounds ?? engineDefaults.maxSounds, 1, 4096));
    const t = options.tuning ?? defaultTuning;
    this.tuning = t;
    this.mapper = new TargetMapper({ tuning: t });
    this.snapshots = new SnapshotStore({ clock: this, maxSources, velocitySmoothingSeconds: t.doppler.velocitySmoothingSeconds, teleportSpeed: t.doppler.teleportSpeed });
    this.stage = new PropagationStage({ maxSources, knots: checkRange('trackKnots', options.trackKnots ?? 256, 16, 4096) });
    this.stage.speedOfSound = propagationSpeed(t);
    this.air = new AirAbsorption(t.air);
    this.bus = new MasterBus({ sampleRate: sr, maxBlockFrames: this.maxBlock, ceilingDb: t.master.ceilingDb, limiter: t.master.limiter, gainDb: t.master.gainDb });
    for (const k of options.tables ?? []) {
      // A table designed for another output rate would fold or image into the audible band here.
      if (!(k instanceof KernelTable) || Math.abs(k.aliasStop - aliasStopFraction(sr)) > 1e-12) throw new RangeError(`EngineOptions.tables: "${String(k?.name)}" was not designed for ${sr} Hz output`);
    }
    this.given = options.tables === undefined ? null : new Map(options.tables.map((k) => [k.name, k]));
    const table = this.tableFor(t.resampler.tier) ?? options.tables?.[0] ?? KernelTable.forTier(t.resampler.tier, sr);
    this.table = table;
    for (let i = 0; i < 2 * this.capacity; i++) this.voices.push(new Voice(i, table, sr, smoothingOf(t), options.kernel ?? 'auto'));
    const stretchCount = checkRange('maxStretchVoices', options.maxStretchVoices ?? engineDefaults.maxStretchVoices, 0, 1024);
    this.stretches = new StretchBank(stretchCount, table, sr, t.smoothing.ratioSeconds, options.kernel ?? 'auto');
    this.pool = new VoicePool({ voices: this.voices, capacity: this.capacity, bank: this.bank, events: this.events });
    this.routes = new GroupRoutes(options.groupOutputs ?? [], this.maxBlock);
    this.routeCeiling = dbToGain(t.master.ceilingDb);
    this.controls = new VoiceControls(this.voices.length, this.events, this.routes);
    this.random = seededRandom(options.seed ?? 1);
    const buf = () => new Float32Array(this.maxBlock);
    const stereo = [buf(), buf()];
    this.scratch = { stereo, mono: [stereo[0]], dry: [buf(), buf()], wasm: null, ratios: new Float32Array(this.maxBlock), stage: this.stage };
    const wasm = this.voices[0].kernelName === 'wasm-simd' ? WasmKernel.shared() : null;
    // Voice scratch, per-sample ratios and mix bus in module memory: the kernel reads, writes and mixes there, with no copies.
    this.resident = wasm === null ? null : new KernelResidency({ kernel: wasm, maxBlockFrames: this.maxBlock, bank: this.bank, scratch: this.scratch, bus: this.bus, owner });
    this.input = { timeScale: 1, group: DEFAULT_GROUP, baseRatio: 1, gain: 1, listener: this.snapshots.listener, source: null, spatial: null };
    this.stats = {
      activeVoices: 0, virtualVoices: 0, steals: 0, clamps: 0, refused: 0, peakIn: 0, peakOut: 0, blasts: 0,
      limiterDb: 0, timeScale: 1, time: 0, errors: 0, tier: table.name as Tuning['resampler']['tier'], kernel: this.voices[0].kernelName,
      ratioClamps: 0, teleports: 0, shockwaves: 0, lastShockwaveTime: NaN, lastShockwaveSource: NaN,
    };
    // Declared with a double (NaN) above, then −1 ("none yet"): a field that held a small integer and later a double
    // changes the object's layout and throws away optimised code using it (docs/allocation.md).
    this.stats.lastShockwaveSource = -1;
  }

  /** Engine clock: seconds rendered so far. */
  get time(): Seconds {
    return this.frameCount / this.sampleRate;
  }

  /** The time scale now (on the time-flow clock, which stops while the world is paused). */
  get timeScaleNow(): number {
    this.lookUpTimeScale();
    return this.flow.value;
  }

  /** The body of `timeScaleNow`: leaves the time scale now in `flow.value` (no double returned: V8 boxes one returned from a call it does not inline). */
  lookUpTimeScale(): void {
    // Through the clocks' fields: V8 boxes a double passed to or returned from a call it does not inline.
    const pause = this.controls.clock;
    pause.host = this.frameCount / this.sampleRate;
    pause.mapHost();
    const flow = this.flow;
    flow.time = pause.flow;
    flow.lookUp();
  }

  /** The table for `tier` at this engine's rate: a given one, else (no tables given) the shared design; null while a given set lacks it. */
  tableFor(tier: Tuning['resampler']['tier']): KernelTable | null {
    if (this.given === null) return KernelTable.forTier(tier, this.sampleRate);
    return this.given.get(tier) ?? null;
  }

  /** Maps a voice's targets into `out`: `group`'s curves at `timeScale`, base ratio and gain, source (null: not positioned) and its own spatial settings. */
  map(out: VoiceTargets, group: string, baseRatio: number, gain: number, source: MovingSource | null, spatial: VoiceInput['spatial'], timeScale: number): void {
    const inp = this.input;
    inp.timeScale = timeScale;
    inp.group = group;
    inp.baseRatio = baseRatio;
    inp.gain = gain;
    inp.source = source;
    inp.spatial = spatial;
    this.mapper.map(out, inp);
  }
}
