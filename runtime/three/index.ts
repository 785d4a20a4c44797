// Public entry of the three.js adapter.
export { ThreeBinding, threeBindingDefaults } from './three-binding';
export type { ThreeBindingOptions, SnapshotTarget } from './three-binding';
