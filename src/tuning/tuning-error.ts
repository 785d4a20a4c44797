// Typed error of the tuning parser: every problem with the JSON path where it was found.

/** One problem found in a tuning document; path like `groups.weapons.pitch.keys[2].x` ('' = the document). */
export interface TuningIssue {
  readonly path: string;
  readonly message: string;
}

/** Thrown by parseTuning; `issues` lists every problem found (at most 100). */
export class TuningError extends Error {
  /** The problems, in document order. */
  readonly issues: readonly TuningIssue[];

  /** Creates the error from a non-empty issue list. */
  constructor(issues: readonly TuningIssue[]) {
    const lines = issues.slice(0, 5).map((i) => `${i.path === '' ? '(document)' : i.path}: ${i.message}`);
    const more = issues.length > 5 ? `; and ${issues.length - 5} more` : '';
    super(`invalid tuning (${issues.length} problem${issues.length === 1 ? '' : 's'}): ${lines.join('; ')}${more}`);
    this.name = 'TuningError';
    this.issues = Object.freeze(issues.map((i) => Object.freeze({ path: i.path, message: i.message })));
  }
}
