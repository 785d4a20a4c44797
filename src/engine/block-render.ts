// The per-block render loop: control values at each block's end (snapshots, time flow, propagation), each voice's
// targets mapped and rendered through its stage chain into the master bus or its group's route, then the buses'
// finish and the stats. Never throws (a caught exception zeroes the block and counts an error), never allocates.
import { EVENT_AUDIBLE, EVENT_VIRTUAL } from './voice-events';
import { VOICE_FREE } from './voice';
import { airStage, propagateVoice } from './voice-propagation';
import type { EngineCore } from './engine-core';

/** Renders `frames` stereo frames into outputs[0|1] and each routed group into groupOutputs[k][0|1], in blocks of at most maxBlock. */
export function renderFrames(core: EngineCore, outputs: readonly Float32Array[], frames: number, groupOutputs: readonly (readonly Float32Array[])[] | undefined): void {
  takeTimeScale(core);
  // A call of Engine.setTimeScale's (the request applied above) renders nothing and leaves the stats as they are.
  const applyOnly = core.timePending;
  core.timePending = false;
  if (applyOnly) return;
  core.timeRequest = core.restingRequests[++core.renderCalls & 1];
  const st = core.stats;
  try {
    st.peakIn = 0;
    st.peakOut = 0;
    for (let done = 0; done < frames; ) {
      const n = frames - done < core.maxBlock ? frames - done : core.maxBlock;
      renderBlock(core, outputs, done, n, groupOutputs);
      done += n;
    }
  } catch {
    st.errors++;
    for (const o of outputs) o.fill(0, 0, Math.min(frames, o.length));
    if (groupOutputs !== undefined) for (const g of groupOutputs) for (const o of g) o.fill(0, 0, Math.min(frames, o.length));
  }
  collectStats(core);
}

/**
 * Reads `core.timeRequest` and works out the ramp it asks for (as `Engine.setTimeScale` did: its start time on the
 * pause clock, made now), and applies it when `core.timePending`. Run on every render call, with one of the engine's
 * resting requests, so that this code is optimised with type feedback before a request comes: a rarely called method runs
 * unoptimised and boxes every double it reads, the request's own fields included (docs/allocation.md). No double
 * crosses a call: each goes over in the callee's fields.
 */
function takeTimeScale(core: EngineCore): void {
  const request = core.timeRequest;
  const pause = core.controls.clock;
  const flow = core.flow;
  const now = core.frameCount / core.sampleRate;
  // The reads in the order setTimeScale made them: startTime, target, rampSeconds, easing. The start time is read only
  // from a request that has one, and stored in its own branch: read from every shape, or as `startTime ?? now`, it
  // would be merged with `undefined`, a value V8 keeps tagged, and the double boxed on every call.
  pause.asked = now;
  if ('startTime' in request) {
    const asked = request.startTime;
    if (asked !== undefined && asked !== null) pause.asked = asked;
  }
  flow.requestTarget = request.target;
  flow.requestRamp = request.rampSeconds;
  flow.requestEasing = request.easing;
  pause.host = now;
  pause.mapRequest();
  flow.requestStart = pause.requested;
  flow.requestNow = pause.flow;
  flow.propose();
  flow.commit(core.timePending);
}

function renderBlock(core: EngineCore, outputs: readonly Float32Array[], offset: number, n: number, groupOutputs: readonly (readonly Float32Array[])[] | undefined): void {
  const bus = core.bus;
  const mixL = bus.left;
  const mixR = bus.right;
  bus.clear(n);
  const routes = core.routes;
  routes.clear(n);
  const controls = core.controls;
  const snapshots = core.snapshots;
  const stage = core.stage;
  core.events.now = core.time;
  // Control values at the block's end, reached there by per-sample ramps from the block's start (no half-block lag).
  // The time flow runs on the pause clock: it holds while the world is paused.
  const tStart = core.frameCount / core.sampleRate;
  const tEnd = (core.frameCount + n) / core.sampleRate;
  snapshots.time = tEnd;
  snapshots.interpolate();
  const input = core.input;
  // Doubles go over in the callees' fields: V8 boxes a double passed to or returned from a call it does not inline.
  const pause = controls.clock;
  const flow = core.flow;
  pause.host = tEnd;
  pause.mapHost();
  flow.time = pause.flow;
  flow.lookUp();
  input.timeScale = flow.value;
  const clock = core.clock;
  clock.now = tStart;
  const voices = core.voices;
  for (let i = 0; i < voices.length; i++) {
    const v = voices[i];
    const p = v.params;
    if (v.state === VOICE_FREE || p.sourceId === -1) continue;
    if (!snapshots.holds(p.sourceSlot, p.sourceId)) v.bindSourceSlot(snapshots.find(p.sourceId));
    if (v.propagating) stage.need(p.sourceSlot);
  }
  pause.host = 0.5 * (tStart + tEnd);
  pause.mapHost();
  flow.time = pause.flow;
  flow.lookUp();
  stage.blockStart = tStart;
  stage.blockEnd = tEnd;
  stage.blockScale = flow.value;
  stage.solveAll();
  for (let i = 0; i < voices.length; i++) {
    const v = voices[i];
    if (v.state === VOICE_FREE) continue;
    const p = v.params;
    const slot = p.sourceId === -1 ? -1 : p.sourceSlot;
    const source = v.propagating ? propagateVoice(stage, v, slot, n, clock, core.emission) : slot >= 0 ? snapshots.sourceAt(slot) : null;
    input.group = p.group;
    input.baseRatio = p.ratio * p.rateFactor;
    input.gain = p.gain;
    input.source = source;
    input.spatial = controls.spatialOf(v);
    core.mapper.map(v.targets, input);
    if (v.propagating && source !== null) airStage(v, core.air);
    controls.beforeRender(v);
    const wasVirtual = v.virtual;
    const route = controls.routeOf(v);
    const alive = route < 0 ? v.render(mixL, mixR, 0, n, core.scratch) : v.render(routes.left[route], routes.right[route], 0, n, routes.scratchFor(core.scratch));
    controls.afterRender(v);
    if (v.virtual !== wasVirtual) core.events.push(v.virtual ? EVENT_VIRTUAL : EVENT_AUDIBLE, core.pool.handleOf(v));
    if (!alive) core.pool.free(v);
  }
  bus.finish(outputs, offset, n, core.stats);
  routes.ceiling = core.routeCeiling;
  routes.finish(groupOutputs, offset, n);
  core.frameCount += n;
}

/** Gathers the counters of every part into the stats after a render call. */
function collectStats(core: EngineCore): void {
  const st = core.stats;
  const readerClamps = core.pool.count(st);
  const stage = core.stage;
  st.clamps = core.clamps + core.routes.clamps + core.mapper.clamps + core.flow.clamps + core.snapshots.clamps + core.bus.clamps + readerClamps + core.stretches.clampCount + stage.ratioClamps + stage.tracks.dropped;
  st.ratioClamps = stage.ratioClamps;
  st.teleports = stage.tracks.teleports;
  if (stage.shockwaves !== st.shockwaves) {
    st.shockwaves = stage.shockwaves;
    st.lastShockwaveTime = stage.lastShockwaveTime;
    st.lastShockwaveSource = stage.lastShockwaveSource;
  }
  st.refused += core.snapshots.refused;
  core.snapshots.refused = 0;
  st.limiterDb = core.bus.limiter.reductionDb;
  core.lookUpTimeScale();
  st.timeScale = core.flow.value;
  st.time = core.time;
}
