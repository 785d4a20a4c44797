// Public entry of the howler adapter.
export { HowlerBridge, extensionOf } from './howler-bridge';
export type { HowlerBridgeOptions, HowlSourceOptions, FetchLike } from './howler-bridge';
export { HowlRateDriver, howlRateDriverDefaults, groupSpeed, HOWL_RATE_MIN, HOWL_RATE_MAX } from './howl-rate-driver';
export type { HowlRateDriverOptions } from './howl-rate-driver';
export type { HowlerGlobalLike, HowlLike, HowlEventName } from './howler-types';
