// Browser side of the controls suite: the parity page's renderScene, plus Chromium's own PannerNode gains for
// distance models and cones (a ConstantSourceNode through an equal-power PannerNode in an OfflineAudioContext).
import './parity-page';

/** One PannerNode configuration; the listener stays at the origin facing −z with +y up (the defaults). */
export interface PannerCase {
  position: [number, number, number];
  orientation: [number, number, number];
  distanceModel: DistanceModelType;
  refDistance: number;
  maxDistance: number;
  rolloffFactor: number;
  coneInnerAngle: number;
  coneOuterAngle: number;
  coneOuterGain: number;
}

/** Renders each case and returns the [left, right] output of a steady unit input, read well after the start. */
async function pannerGains(cases: PannerCase[]): Promise<[number, number][]> {
  const out: [number, number][] = [];
  for (const c of cases) {
    const ctx = new OfflineAudioContext(2, 1024, 48000);
    const src = new ConstantSourceNode(ctx, { offset: 1 });
    const p = new PannerNode(ctx, {
      panningModel: 'equalpower', distanceModel: c.distanceModel, refDistance: c.refDistance, maxDistance: c.maxDistance,
      rolloffFactor: c.rolloffFactor, coneInnerAngle: c.coneInnerAngle, coneOuterAngle: c.coneOuterAngle, coneOuterGain: c.coneOuterGain,
      positionX: c.position[0], positionY: c.position[1], positionZ: c.position[2],
      orientationX: c.orientation[0], orientationY: c.orientation[1], orientationZ: c.orientation[2],
    });
    src.connect(p).connect(ctx.destination);
    src.start();
    const b = await ctx.startRendering();
    out.push([b.getChannelData(0)[900], b.getChannelData(1)[900]]);
  }
  return out;
}

Object.assign(globalThis, { pannerGains });

/** Plays `samples` (48 kHz) looping in 'music' (routed, −6 dB) and at ratio 0.5 in 'interface'; renders the main output or music's own output. */
async function renderRouted(samples: number[], which: 'main' | 'music', frames: number): Promise<number[][]> {
  const ctx = new OfflineAudioContext(2, frames, 48000);
  const { createRalenti } = await import('../../runtime/index');
  const r = await createRalenti(ctx, { workletUrl: '/ralenti-processor.js', groupOutputs: ['music'] });
  (which === 'main' ? r.node : r.groupOutput('music')).connect(ctx.destination);
  const s = r.load({ channels: [Float32Array.from(samples)], sampleRate: 48000 });
  r.play(s, { group: 'music', loop: true, fadeInSeconds: 0 });
  r.play(s, { group: 'interface', loop: true, fadeInSeconds: 0, ratio: 0.5 });
  r.setGroupVolume('music', -6);
  await r.flush();
  const b = await ctx.startRendering();
  r.dispose();
  return [Array.from(b.getChannelData(0)), Array.from(b.getChannelData(1))];
}

Object.assign(globalThis, { renderRouted });
