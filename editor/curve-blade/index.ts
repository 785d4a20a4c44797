// The curve blade: a tweakpane blade plugin for editing a tuning curve against the time scale.
export { CurveBladePlugin, curveBladeBundle, addCurveBlade, type CurveBladeParams, type BladeParent } from './curve-plugin';
export { CurveBladeApi, type CurveBladeEvents } from './curve-api';
export { CurveController } from './curve-controller';
export { CurveView } from './curve-view';
export * from './curve-model';
