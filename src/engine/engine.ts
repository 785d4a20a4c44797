// The voice engine: a fixed pool of voices over decoded sounds, rendered block by block (control rate = block),
// mixed to a stereo master bus with a safety limiter. One engine, two hosts (AudioWorklet and Node).
import type { Hz, Seconds } from '../units';
import type { EngineOptions, EngineSnapshot, EngineStats, PlayOptions, ShockwaveEvent, VoiceMonitor } from './engine-types';
import type { SourceState, TimeScaleRequest } from '../dilation';
import type { Vec3Like } from '../units';
import { AirAbsorption, speedOfSound } from '../motion';
import { PropagationStage } from './propagation-stage';
import { airStage, propagateVoice } from './voice-propagation';
import { defaultTuning, DEFAULT_GROUP, type Tuning } from '../tuning';
import { KernelTable, WasmKernel, aliasStopFraction, MAX_RATIO, MIN_RATIO } from '../dsp';
import { TargetMapper, TimeFlow, createVoiceTargets, type VoiceInput } from '../dilation';
import { SoundBank } from './sound-bank';
import { SnapshotStore } from './snapshot-store';
import { MasterBus } from './master-bus';
import { KernelResidency } from './kernel-residency';
import { EngineClosedError } from './engine-closed-error';
import { VoicePool } from './voice-pool';
import { checkRange, clampNumber, copyTargets } from './engine-values';
import { StretchBank } from './stretch-stage';
import { Voice, VOICE_FREE, VOICE_PLAYING, gainToDbFloor, targetAudibility, FREEZE_FADE_SECONDS, type VoiceScratch } from './voice';
import { seededRandom } from '../random';
import { sourceSpatialProblems, type SourceSpatial } from '../dilation';
import { VoiceControls, type VoiceStateName } from './voice-controls';
import { EVENT_AUDIBLE, EVENT_VIRTUAL, VoiceEventRing } from './voice-events';
import { drawVariation, MAX_PITCH_VARIATION_CENTS, MAX_GAIN_VARIATION_DB, MIN_GAIN_VARIATION_DB } from './play-variation';
import { MAX_GROUP_VOLUME_DB, MIN_GROUP_VOLUME_DB } from './group-bus';
import { GroupRoutes } from './group-routes';

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

/** Renders voices of decoded sounds with time-scale and Doppler pitch, dilation tone, panning and a master limiter. */
export class Engine {
  /** Counters and levels, updated by every render call (the same object throughout). */
  readonly stats: EngineStats;
  /** Output sample rate, Hz. */
  readonly sampleRate: Hz;
  /** Voice pool size. */
  readonly capacity: number;
  private readonly maxBlock: number;
  private readonly voices: Voice[] = [];
  private readonly pool: VoicePool;
  private readonly bank: SoundBank;
  private readonly snapshots: SnapshotStore;
  private readonly flow = new TimeFlow();
  private readonly mapper: TargetMapper;
  private readonly bus: MasterBus;
  private readonly scratch: VoiceScratch;
  private readonly stretches: StretchBank;
  /** Module-memory bookkeeping when the voices run on the WebAssembly kernel, else null (TypeScript kernel). */
  private readonly resident: KernelResidency | null;
  private readonly input: VoiceInput;
  private readonly probe: Voice['targets'] = createVoiceTargets();
  private readonly stage: PropagationStage;
  private readonly air: AirAbsorption;
  /** Emission-time state of a propagating voice's source, handed to the mapper (velocity 0: the Doppler is in the read). */
  private readonly emission: SourceState & { velocity: Vec3Like } = { id: 0, position: { x: 0, y: 0, z: 0 }, velocity: { x: 0, y: 0, z: 0 } };
  private readonly slotOf = (id: number): number => this.snapshots.find(id);
  private tuning: Tuning;
  private frameCount = 0;
  private sequence = 0;
  private engineClamps = 0;
  /** Voice events (ended, stolen, virtual, audible) waiting for the host: drain with drainEvents. */
  readonly events = new VoiceEventRing();
  private readonly controls: VoiceControls;
  private readonly random: () => number;
  private readonly routes: GroupRoutes;
  private routeCeiling = 1;
  /** Tables handed in by the host (by tier name), or null: the engine designs its own (`KernelTable.forTier`). */
  private readonly given: Map<string, KernelTable> | null;
  private table: KernelTable;
  private closed = false;

  /** Builds every voice, buffer and table up front; throws RangeError naming a bad option. */
  constructor(options: EngineOptions) {
    const sr = options.sampleRate;
    if (!(sr >= 8000 && sr <= 192000)) throw new RangeError(`EngineOptions.sampleRate must be 8000…192000 Hz, got ${sr}`);
    this.sampleRate = sr;
    this.capacity = checkRange('capacity', options.capacity ?? engineDefaults.capacity, 1, 1024);
    this.maxBlock = checkRange('maxBlockFrames', options.maxBlockFrames ?? engineDefaults.maxBlockFrames, 1, 16384);
    const maxSources = checkRange('maxSources', options.maxSources ?? engineDefaults.maxSources, 1, 4096);
    this.bank = new SoundBank(checkRange('maxSounds', options.maxSounds ?? engineDefaults.maxSounds, 1, 4096));
    const t = options.tuning ?? defaultTuning;
    this.tuning = t;
    this.mapper = new TargetMapper({ tuning: t });
    this.snapshots = new SnapshotStore({ maxSources, velocitySmoothingSeconds: t.doppler.velocitySmoothingSeconds, teleportSpeed: t.doppler.teleportSpeed });
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
    for (let i = 0; i < 2 * this.capacity; i++) {
      const v = new Voice(table, sr, this.smoothing(t), options.kernel ?? 'auto');
      v.index = i;
      this.voices.push(v);
    }
    const stretchCount = checkRange('maxStretchVoices', options.maxStretchVoices ?? engineDefaults.maxStretchVoices, 0, 1024);
    this.stretches = new StretchBank(stretchCount, table, sr, t.smoothing.ratioSeconds, options.kernel ?? 'auto');
    this.pool = new VoicePool({ voices: this.voices, capacity: this.capacity, bank: this.bank, events: this.events });
    this.routes = new GroupRoutes(options.groupOutputs ?? [], this.maxBlock);
    this.routeCeiling = Math.pow(10, t.master.ceilingDb / 20);
    this.controls = new VoiceControls(this.voices.length, this.events, this.routes);
    this.random = seededRandom(options.seed ?? 1);
    const buf = () => new Float32Array(this.maxBlock);
    const stereo = [buf(), buf()];
    this.scratch = { stereo, mono: [stereo[0]], dry: [buf(), buf()], wasm: null, ratios: new Float32Array(this.maxBlock), stage: this.stage };
    const wasm = this.voices[0].reader.kernelName === 'wasm-simd' ? WasmKernel.shared() : null;
    // Voice scratch and mix bus in module memory: the kernel writes and the module mixes there, with no copies.
    this.resident = wasm === null ? null : new KernelResidency({ kernel: wasm, maxBlockFrames: this.maxBlock, bank: this.bank, scratch: this.scratch, bus: this.bus, owner: this });
    this.input = { timeScale: 1, group: DEFAULT_GROUP, baseRatio: 1, gain: 1, listener: this.snapshots.listener, source: null, spatial: null };
    this.stats = {
      activeVoices: 0, virtualVoices: 0, steals: 0, clamps: 0, refused: 0, peakIn: 0, peakOut: 0, blasts: 0,
      limiterDb: 0, timeScale: 1, time: 0, errors: 0, tier: table.name as Tuning['resampler']['tier'], kernel: this.voices[0].reader.kernelName,
      ratioClamps: 0, teleports: 0, shockwaves: 0, lastShockwaveTime: NaN, lastShockwaveSource: -1,
    };
  }

  /** Engine clock: seconds rendered so far. */
  get time(): Seconds {
    return this.frameCount / this.sampleRate;
  }

  /** The tuning in use. */
  get currentTuning(): Tuning {
    return this.tuning;
  }

  /**
   * Stores a decoded sound (1 or 2 channels, equal lengths, any rate up to 768 kHz); returns its id, or −1 (counted in refused).
   * On the wasm kernel the samples are copied into module memory here: later changes to the arrays are not heard.
   */
  addSound(channels: readonly Float32Array[], sampleRate: Hz): number {
    this.live('addSound');
    const id = this.bank.add(channels, sampleRate);
    if (id < 0) this.stats.refused++;
    else if (this.resident !== null) this.resident.makeResident(this.bank.slot(id));
    return id;
  }

  /** Removes a sound; its voices fade out (default stop fade) and the slot frees once they are silent. */
  removeSound(id: number): void {
    this.live('removeSound');
    const s = this.bank.slot(id);
    if (s < 0) return;
    for (let i = 0; i < this.voices.length; i++) {
      const v = this.voices[i];
      if (v.state === VOICE_PLAYING && v.sound === s) this.pool.release(v, engineDefaults.stopFadeSeconds);
    }
    this.bank.remove(id);
  }

  /** Starts a voice; returns its handle, or −1 if refused (unknown sound, or a full pool of higher priority). */
  play(sound: number, options: PlayOptions = {}): number {
    this.live('play');
    const slot = this.bank.slot(sound);
    if (slot < 0) {
      this.stats.refused++;
      return -1;
    }
    let group = options.group ?? DEFAULT_GROUP;
    if (!this.mapper.hasGroup(group)) {
      group = DEFAULT_GROUP;
      this.engineClamps++;
    }
    const compiled = this.mapper.group(group);
    const priority = clampNumber(options.priority ?? compiled.priority, 0, 255, compiled.priority);
    this.events.now = this.time;
    let gain = options.gainDb !== undefined ? Math.pow(10, clampNumber(options.gainDb, MIN_GROUP_VOLUME_DB, MAX_GROUP_VOLUME_DB, 0) / 20) : clampNumber(options.gain ?? 1, 0, 16, 1);
    let ratio = options.ratio === undefined ? 1 : options.ratio > 0 && options.ratio <= 4 ? options.ratio : (this.engineClamps++, 1);
    // Per-play variation, drawn in a fixed order (pitch, then gain) so that both hosts draw the same numbers.
    ratio = clampNumber(ratio * Math.pow(2, drawVariation(this.random, options.pitchRange, -MAX_PITCH_VARIATION_CENTS, MAX_PITCH_VARIATION_CENTS) / 1200), 1 / 1024, 4, 1);
    gain = clampNumber(gain * Math.pow(10, drawVariation(this.random, options.gainRange, MIN_GAIN_VARIATION_DB, MAX_GAIN_VARIATION_DB) / 20), 0, 16, 1);
    const sourceId = options.sourceId !== undefined && Number.isFinite(options.sourceId) ? options.sourceId : -1;
    const rate = this.bank.rates[slot];
    // Targets now, for the stealing decision and so that the voice starts at its proper pitch.
    this.snapshots.interpolate(this.time);
    const src = sourceId === -1 ? -1 : this.snapshots.find(sourceId);
    this.input.spatial = sourceId === -1 ? null : (this.controls.spatial.get(sourceId) ?? null);
    this.mapInto(this.probe, group, (ratio * rate) / this.sampleRate, gain, src);
    const audibility = targetAudibility(this.probe);
    if (this.pool.full) {
      if (!this.pool.steal(priority, audibility, engineDefaults.stealFadeSeconds)) {
        this.stats.refused++;
        return -1;
      }
      this.stats.steals++;
    }
    const v = this.pool.take();
    v.sound = slot;
    v.channels = this.bank.channels[slot]!.length;
    v.rateFactor = rate / this.sampleRate;
    v.group = group;
    v.followsTime = compiled.followsSpeed;
    v.priority = priority;
    v.gain = gain;
    v.ratio = ratio;
    v.sourceId = sourceId;
    v.sourceSlot = src;
    v.sequence = this.sequence++;
    // Stretched voices read through their own stage at the same-instant ratio (propagation reads the sound itself).
    v.propagating = sourceId !== -1 && compiled.motion === 'propagation' && !compiled.stretches;
    v.airEngaged = false;
    v.arrived = !v.propagating;
    v.startTime = this.time;
    v.arrivalFrames = 0;
    v.arrivalSkipFrames = 0;
    v.dopplerStart = 1;
    v.dopplerEnd = 1;
    v.virtual = false;
    v.fresh = true;
    v.thawing = false;
    this.controls.attach(v, compiled.policy === 'exempt');
    const fadeIn = options.fadeInSeconds ?? engineDefaults.fadeInSeconds;
    v.env = fadeIn > 0 ? 0 : 1;
    v.envTarget = 1;
    v.attackStep = v.fadeStep(fadeIn);
    v.releaseStep = v.fadeStep(engineDefaults.stopFadeSeconds);
    copyTargets(this.probe, v.targets);
    const offset = clampNumber((options.offsetSeconds ?? 0) * rate, 0, this.bank.frames[slot], 0);
    const from = { loop: options.loop === true, loopStart: options.loopStart, loopEnd: options.loopEnd, startFrame: offset };
    v.reader.setSource(this.bank.channels[slot]!, from);
    v.stretch = null;
    if (compiled.stretches) {
      v.stretch = this.stretches.claim(v.index, this.voices);
      if (v.stretch === null) this.engineClamps++; // every stage busy: this voice plays tape-style
      else v.stretch.start(this.bank.channels[slot]!, from);
    }
    this.bank.release(slot, 1);
    return this.pool.handleOf(v);
  }

  /** Stops a voice with a fade (s; default 0.01, 0 = at once); unknown or stale handles are ignored. */
  stop(voice: number, fadeSeconds: Seconds = engineDefaults.stopFadeSeconds): void {
    this.live('stop');
    const v = this.pool.resolve(voice);
    if (v !== null && v.state === VOICE_PLAYING) this.pool.release(v, fadeSeconds);
  }

  /** Changes a playing voice's linear gain (0…16) or base ratio ((0, 4]); changes glide with the tuning's smoothing. */
  setVoice(voice: number, change: { gain?: number; ratio?: number }): void {
    this.live('setVoice');
    const v = this.pool.resolve(voice);
    if (v === null) return;
    if (change.gain !== undefined) v.gain = clampNumber(change.gain, 0, 16, v.gain);
    if (change.ratio !== undefined) v.ratio = change.ratio > 0 && change.ratio <= 4 ? change.ratio : (this.engineClamps++, v.ratio);
  }

  /** Switches tuning (a parseTuning result); voices keep playing and glide to the new targets. */
  setTuning(t: Tuning): void {
    this.live('setTuning');
    this.tuning = t;
    this.mapper.setTuning(t);
    this.snapshots.configure(t.doppler.velocitySmoothingSeconds, t.doppler.teleportSpeed);
    this.stage.speedOfSound = propagationSpeed(t);
    this.air.configure(t.air);
    this.bus.configure(t.master.ceilingDb, t.master.limiter, t.master.gainDb);
    this.routeCeiling = Math.pow(10, t.master.ceilingDb / 20);
    this.switchTable(this.tableFor(t.resampler.tier));
    const sm = this.smoothing(t);
    this.stretches.configure(this.table, t.smoothing.ratioSeconds);
    for (const v of this.voices) {
      v.setSmoothing(sm);
      if (v.state === VOICE_FREE) continue;
      if (!this.mapper.hasGroup(v.group)) v.group = DEFAULT_GROUP;
      const g = this.mapper.group(v.group);
      v.followsTime = g.followsSpeed;
      const propagating = v.sourceId !== -1 && g.motion === 'propagation' && v.stretch === null;
      if (propagating !== v.propagating) {
        // A model switch mid-voice: keep playing from where the read is (no new delay).
        v.propagating = propagating;
        v.arrived = true;
        v.dopplerStart = v.dopplerEnd = 1;
      }
      this.controls.rebind(v, g.policy === 'exempt');
    }
  }

  /** Adds tables designed elsewhere (by tier name, replacing any of the same name); switches at once if the tuning's tier was waiting for one. */
  useTables(tables: readonly KernelTable[]): void {
    this.live('useTables');
    if (this.given === null) return;
    for (const k of tables) this.given.set(k.name, k);
    this.switchTable(this.tableFor(this.tuning.resampler.tier));
  }

  /** The table for `tier` at this engine's rate: a given one, else (no tables given) the shared design; null while a given set lacks it. */
  private tableFor(tier: Tuning['resampler']['tier']): KernelTable | null {
    if (this.given === null) return KernelTable.forTier(tier, this.sampleRate);
    return this.given.get(tier) ?? null;
  }

  private switchTable(table: KernelTable | null): void {
    if (table === null || table === this.table) return;
    this.table = table;
    for (const v of this.voices) v.reader.setTable(table);
    this.stretches.configure(table, this.tuning.smoothing.ratioSeconds);
    this.stats.tier = table.name as Tuning['resampler']['tier'];
  }

  /** Stores a gameplay snapshot; positions glide from the previous one across the snapshot interval. */
  pushSnapshot(s: EngineSnapshot): void {
    this.live('pushSnapshot');
    try {
      if (s.timeScale !== undefined) this.flow.jump(s.timeScale, this.controls.flowTime(this.time));
      this.snapshots.push(s, this.time);
      this.stage.push(s, this.time, this.snapshots.snapshotInterval, this.slotOf);
    } catch {
      this.stats.errors++;
    }
  }

  /** Starts a time-scale ramp (startTime defaults to now, engine time). */
  setTimeScale(request: TimeScaleRequest): void {
    this.live('setTimeScale');
    const now = this.time;
    // In time-flow time, which stops while the world is paused: a ramp asked for during a pause starts on resume.
    const startTime = this.controls.clock.requestTime(request.startTime ?? now, now);
    this.flow.set({ target: request.target, rampSeconds: request.rampSeconds, easing: request.easing, startTime }, this.controls.flowTime(now));
  }

  /**
   * Declares that source `sourceId` jumps: its next snapshot restarts its track (no Doppler sweep across the jump;
   * voices on it keep playing without a jump in their read). Unknown ids are ignored.
   */
  teleport(sourceId: number): void {
    this.live('teleport');
    this.stage.teleport(sourceId);
  }

  /** Copies pending Mach-cone arrivals (oldest first, up to out.length) into `out`; returns how many. */
  drainShockwaves(out: ShockwaveEvent[]): number {
    this.live('drainShockwaves');
    return this.stage.drainShockwaves(out);
  }

  /**
   * Renders `frames` stereo frames into outputs[0] (left) and outputs[1] (right), and each routed group (EngineOptions
   * .groupOutputs, in order) into groupOutputs[k][0|1] when given; never throws, never allocates.
   */
  render(outputs: readonly Float32Array[], frames: number, groupOutputs?: readonly (readonly Float32Array[])[]): void {
    const st = this.stats;
    if (this.closed) {
      this.renderDisposed(outputs, frames, groupOutputs);
      return;
    }
    try {
      st.peakIn = 0;
      st.peakOut = 0;
      for (let done = 0; done < frames; ) {
        const n = frames - done < this.maxBlock ? frames - done : this.maxBlock;
        this.block(outputs, done, n, groupOutputs);
        done += n;
      }
    } catch {
      st.errors++;
      for (const o of outputs) o.fill(0, 0, Math.min(frames, o.length));
      if (groupOutputs !== undefined) for (const g of groupOutputs) for (const o of g) o.fill(0, 0, Math.min(frames, o.length));
    }
    const readerClamps = this.pool.count(st);
    const stage = this.stage;
    st.clamps = this.engineClamps + this.routes.clamps + this.mapper.clamps + this.flow.clamps + this.snapshots.clamps + this.bus.clamps + readerClamps + this.stretches.clampCount + stage.ratioClamps + stage.tracks.dropped;
    st.ratioClamps = stage.ratioClamps;
    st.teleports = stage.tracks.teleports;
    if (stage.shockwaves !== st.shockwaves) {
      st.shockwaves = stage.shockwaves;
      st.lastShockwaveTime = stage.lastShockwaveTime;
      st.lastShockwaveSource = stage.lastShockwaveSource;
    }
    st.refused += this.snapshots.refused;
    this.snapshots.refused = 0;
    st.limiterDb = this.bus.limiter.reductionDb;
    st.timeScale = this.flow.valueAt(this.controls.flowTime(this.time));
    st.time = this.time;
  }

  /**
   * Releases what the engine holds outside its own objects (its regions of the WebAssembly kernel's memory: voice
   * scratch, mix bus, resident sounds), at once, for the next engine to reuse; idempotent. Afterwards `render` outputs
   * silence (each call counted in stats.refused) and every other method throws EngineClosedError.
   */
  dispose(): void {
    if (this.closed) return;
    this.closed = true;
    this.resident?.release();
  }

  /** True after `dispose()`. */
  get disposed(): boolean {
    return this.closed;
  }

  /** Throws EngineClosedError naming `call` once the engine is disposed. */
  private live(call: string): void {
    if (this.closed) throw new EngineClosedError(`Engine.${call}`);
  }

  private renderDisposed(outputs: readonly Float32Array[], frames: number, groupOutputs?: readonly (readonly Float32Array[])[]): void {
    this.stats.refused++;
    for (const o of outputs) o.fill(0, 0, Math.min(frames, o.length));
    if (groupOutputs !== undefined) for (const g of groupOutputs) for (const o of g) o.fill(0, 0, Math.min(frames, o.length));
  }

  /** Pauses the whole world (no group: every pausable group, and the time scale's transitions) or one group; click-free. */
  pause(group?: string): void {
    this.live('pause');
    if (group !== undefined) this.controls.buses.setPaused(group, true);
    else if (!this.controls.buses.worldPaused) {
      this.controls.buses.worldPaused = true;
      this.controls.clock.pause(this.time);
    }
  }

  /** Resumes the whole world (no group) or one group paused on its own; held voices fade back in where they were. */
  resume(group?: string): void {
    this.live('resume');
    if (group !== undefined) this.controls.buses.setPaused(group, false);
    else if (this.controls.buses.worldPaused) {
      this.controls.buses.worldPaused = false;
      this.controls.clock.resume(this.time);
    }
  }

  /** Whether a world pause holds `group` (default: every group whose policy is not 'exempt'). */
  setGroupPausable(group: string, pausable: boolean): void {
    this.live('setGroupPausable');
    this.controls.buses.setPausable(group, pausable === true);
  }

  /** Sets a group's bus volume in dB (−120…24, clamped and counted); changes glide with the gain smoothing. */
  setGroupVolume(group: string, db: number): void {
    this.live('setGroupVolume');
    if (!this.controls.buses.setVolume(group, db)) this.engineClamps++;
  }

  /** Mutes or unmutes a group's bus (its voices go virtual and keep time). */
  setGroupMute(group: string, muted: boolean): void {
    this.live('setGroupMute');
    this.controls.buses.setMute(group, muted);
  }

  /** Solos or unsolos a group's bus: while any group is soloed, only soloed groups are heard. */
  setGroupSolo(group: string, solo: boolean): void {
    this.live('setGroupSolo');
    this.controls.buses.setSolo(group, solo);
  }

  /** A group bus's state: volume in dB, mute, solo and its own pause. */
  getGroupState(group: string): { volumeDb: number; muted: boolean; solo: boolean; paused: boolean } {
    this.live('getGroupState');
    const b = this.controls.buses.bus(group);
    return { volumeDb: b.volumeDb, muted: b.muted, solo: b.solo, paused: b.paused };
  }

  /** Moves a voice's read head to `seconds` of source time (clamped to the sound) after a short fade; stale handles are ignored. */
  seek(voice: number, seconds: Seconds): void {
    this.live('seek');
    const v = this.pool.resolve(voice);
    if (v === null || v.state !== VOICE_PLAYING) return;
    const rate = v.rateFactor * this.sampleRate;
    const frames = this.bank.frames[v.sound];
    if (!(seconds >= 0 && seconds * rate <= frames)) this.engineClamps++;
    this.controls.seek(v, clampNumber(seconds * rate, 0, frames, 0));
  }

  /** A voice's state: 'playing', 'virtual', 'stopping' (fading out after stop or steal) or 'ended'. */
  voiceState(voice: number): VoiceStateName {
    this.live('voiceState');
    return this.controls.stateOf(this.pool.resolve(voice));
  }

  /** A voice's read position in seconds of source time, or −1 once it has ended. */
  voicePosition(voice: number): Seconds {
    this.live('voicePosition');
    const v = this.pool.resolve(voice);
    if (v === null) return -1;
    return (v.stretch !== null ? v.stretch.reader.position : v.reader.position) / (v.rateFactor * this.sampleRate);
  }

  /** Source seconds a voice advances per output second now (its smoothed ratio; 0 while held), or 0 once ended. */
  voiceSpeed(voice: number): number {
    this.live('voiceSpeed');
    const v = this.pool.resolve(voice);
    return v === null || (v.held && v.env === 0) ? 0 : v.currentRatio / v.rateFactor;
  }

  /** Sets (null: clears) a source's own distance model and cone; an invalid object is refused whole (counted in refused). */
  setSourceSpatial(sourceId: number, spatial: SourceSpatial | null): void {
    this.live('setSourceSpatial');
    if (spatial !== null && sourceSpatialProblems(spatial).length > 0) {
      this.stats.refused++;
      return;
    }
    this.controls.setSourceSpatial(sourceId, spatial, this.voices);
  }

  /** Moves waiting voice events into `out` as (code, voice handle, engine time) triples; returns the event count. */
  drainEvents(out: Float64Array): number {
    this.live('drainEvents');
    return this.events.drain(out);
  }

  /** Fills `out` with the playing voices (up to out.length) and returns how many were written. */
  monitor(out: VoiceMonitor[]): number {
    this.live('monitor');
    let k = 0;
    for (let i = 0; i < this.voices.length && k < out.length; i++) {
      const v = this.voices[i];
      if (v.state === VOICE_FREE) continue;
      const m = out[k++];
      m.voice = this.pool.handleOf(v);
      m.sourceId = v.sourceId;
      m.group = v.group;
      // The ratio in use: a propagating voice's read includes the Doppler factor, clamped as fillRatios clamps it.
      const r = v.propagating ? v.currentRatio * v.dopplerEnd : v.currentRatio;
      m.ratioCents = 1200 * Math.log2(r < MIN_RATIO ? MIN_RATIO : r > MAX_RATIO ? MAX_RATIO : r);
      m.dopplerCents = v.propagating ? 1200 * Math.log2(v.dopplerEnd) : v.dopplerCents.value;
      m.radialSpeed = v.targets.radialSpeed;
      m.distance = v.targets.distance;
      m.cutoffHz = v.currentCutoff;
      m.gainDb = gainToDbFloor(v.targets.gain);
      m.virtual = v.virtual;
    }
    return k;
  }

  private block(outputs: readonly Float32Array[], offset: number, n: number, groupOutputs: readonly (readonly Float32Array[])[] | undefined): void {
    const mixL = this.bus.left;
    const mixR = this.bus.right;
    this.bus.clear(n);
    const routes = this.routes;
    routes.clear(n);
    const controls = this.controls;
    this.events.now = this.time;
    // Control values at the block's end, reached there by per-sample ramps from the block's start (no half-block lag).
    // The time flow runs on the pause clock: it holds while the world is paused.
    const tStart = this.frameCount / this.sampleRate;
    const tEnd = (this.frameCount + n) / this.sampleRate;
    this.snapshots.interpolate(tEnd);
    const s = this.flow.valueAt(controls.flowTime(tEnd));
    const voices = this.voices;
    for (let i = 0; i < voices.length; i++) {
      const v = voices[i];
      if (v.state === VOICE_FREE || v.sourceId === -1) continue;
      if (!this.snapshots.holds(v.sourceSlot, v.sourceId)) v.sourceSlot = this.snapshots.find(v.sourceId);
      if (v.propagating) this.stage.need(v.sourceSlot);
    }
    this.stage.advance(tStart, tEnd, this.flow.valueAt(controls.flowTime(0.5 * (tStart + tEnd))));
    for (let i = 0; i < voices.length; i++) {
      const v = voices[i];
      if (v.state === VOICE_FREE) continue;
      const slot = v.sourceId === -1 ? -1 : v.sourceSlot;
      const source = v.propagating ? propagateVoice(this.stage, v, slot, n, this.time, this.sampleRate, this.emission) : slot >= 0 ? this.snapshots.sourceAt(slot) : null;
      this.input.spatial = controls.spatialOf(v);
      this.mapSource(v.targets, v.group, v.ratio * v.rateFactor, v.gain, source, s);
      if (v.propagating && source !== null) airStage(v, this.air);
      controls.beforeRender(v);
      const wasVirtual = v.virtual;
      const route = controls.routeOf(v);
      const alive = route < 0 ? v.render(mixL, mixR, 0, n, this.scratch) : v.render(routes.left[route], routes.right[route], 0, n, routes.scratchFor(this.scratch));
      controls.afterRender(v);
      if (v.virtual !== wasVirtual) this.events.push(v.virtual ? EVENT_VIRTUAL : EVENT_AUDIBLE, this.pool.handleOf(v));
      if (!alive) this.pool.free(v);
    }
    this.bus.finish(outputs, offset, n, this.stats);
    routes.finish(groupOutputs, offset, n, this.routeCeiling);
    this.frameCount += n;
  }

  private mapInto(out: Voice['targets'], group: string, baseRatio: number, gain: number, sourceSlot: number, timeScale = this.flow.valueAt(this.controls.flowTime(this.time))): void {
    this.mapSource(out, group, baseRatio, gain, sourceSlot >= 0 ? this.snapshots.sourceAt(sourceSlot) : null, timeScale);
  }

  private mapSource(out: Voice['targets'], group: string, baseRatio: number, gain: number, source: (SourceState & { velocity: Vec3Like }) | null, timeScale: number): void {
    const inp = this.input;
    inp.timeScale = timeScale;
    inp.group = group;
    inp.baseRatio = baseRatio;
    inp.gain = gain;
    inp.source = source;
    this.mapper.map(out, inp);
  }

  private smoothing(t: Tuning): { ratio: Seconds; doppler: Seconds; cutoff: Seconds; gain: Seconds } {
    return { ratio: t.smoothing.ratioSeconds, doppler: t.doppler.smoothingSeconds, cutoff: t.smoothing.cutoffSeconds, gain: t.smoothing.gainSeconds };
  }
}

/** Freeze fade of groups at time scale 0, s (re-exported for hosts and tests). */
export const ENGINE_FREEZE_FADE_SECONDS = FREEZE_FADE_SECONDS;

/** Largest propagation speed used (a Doppler factor near 0): sound then arrives at once with no shift, m/s. */
const MAX_PROPAGATION_SPEED = 1e9;

/**
 * Speed of sound for the propagation model, m/s: the air's, divided by the tuning's Doppler factor — the factor scales
 * the velocities against c as in OpenAL 1.1 §3.5.2 (docs/references.md §1c), so 2 doubles the shift and 0 removes it.
 */
function propagationSpeed(t: Tuning): number {
  const c = t.air.speedOfSound ?? speedOfSound(t.air.temperatureCelsius);
  const f = t.doppler.factor;
  return f > c / MAX_PROPAGATION_SPEED ? c / f : MAX_PROPAGATION_SPEED;
}
