// Typed error for invalid arguments on main-thread DSP entry points (the audio path clamps and counts instead).

/** A RangeError naming the offending argument (e.g. 'ratio', 'quality', 'ratio[12]'). */
export class DspArgumentError extends RangeError {
  /** Name of the argument that was out of range. */
  readonly argument: string;

  /** `argument`: the argument's name; `message`: what was expected. */
  constructor(argument: string, message: string) {
    super(`${argument}: ${message}`);
    this.name = 'DspArgumentError';
    this.argument = argument;
  }
}
