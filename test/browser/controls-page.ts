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
