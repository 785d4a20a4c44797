// Typed error of the main-thread API: the option or argument at fault is named in `field`.

/** Thrown on the main thread for an invalid option or argument; nothing was changed. */
export class RalentiOptionError extends Error {
  /** Dotted name of the offending field, e.g. 'play.gain' or 'createRalenti.capacity'. */
  readonly field: string;

  /** Creates the error for `field`, with what was expected. */
  constructor(field: string, message: string) {
    super(`${field}: ${message}`);
    this.name = 'RalentiOptionError';
    this.field = field;
  }
}

/** Throws RalentiOptionError unless `value` is a finite number within [min, max]. */
export function checkRange(field: string, value: unknown, min: number, max: number): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < min || value > max) {
    throw new RalentiOptionError(field, `expected a number in ${min}…${max}, got ${String(value)}`);
  }
  return value;
}

/** Throws RalentiOptionError unless `value` is an integer within [min, max]. */
export function checkInteger(field: string, value: unknown, min: number, max: number): number {
  checkRange(field, value, min, max);
  if (!Number.isInteger(value)) throw new RalentiOptionError(field, `expected an integer, got ${String(value)}`);
  return value as number;
}

/** Thrown by every call on a runtime after `dispose()` or after its AudioContext was closed; `field` names the call. */
export class RalentiClosedError extends RalentiOptionError {
  /** Creates the error for call `field` ('play', 'update', …); `why` is 'disposed' or 'closed'. */
  constructor(field: string, why: 'disposed' | 'closed') {
    super(field, why === 'disposed' ? 'the runtime was disposed' : 'the AudioContext was closed');
    this.name = 'RalentiClosedError';
  }
}
