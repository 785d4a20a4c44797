// Typed error of a call on an engine after Engine.dispose(): the call at fault is named in `field`.

/** Thrown by every Engine method but `render` (which outputs silence and counts it) after `dispose()`. */
export class EngineClosedError extends Error {
  /** The refused call, e.g. 'Engine.play'. */
  readonly field: string;

  /** Creates the error for call `field`. */
  constructor(field: string) {
    super(`${field}: the engine was disposed`);
    this.name = 'EngineClosedError';
    this.field = field;
  }
}
