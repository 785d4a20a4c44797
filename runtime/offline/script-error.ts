// Typed error of the scene-script parser: every problem with the JSON path where it was found.

/** One problem found in a scene script; path like `voices[2].sound` ('' = the document). */
export interface ScriptIssue {
  readonly path: string;
  readonly message: string;
}

/** Thrown by parseSceneScript (and by loading a script's files); `issues` lists every problem found. */
export class ScriptError extends Error {
  /** The problems, in document order. */
  readonly issues: readonly ScriptIssue[];

  /** Creates the error from a non-empty issue list. */
  constructor(issues: readonly ScriptIssue[]) {
    const lines = issues.slice(0, 5).map((i) => `${i.path === '' ? '(document)' : i.path}: ${i.message}`);
    const more = issues.length > 5 ? `; and ${issues.length - 5} more` : '';
    super(`invalid scene script (${issues.length} problem${issues.length === 1 ? '' : 's'}): ${lines.join('; ')}${more}`);
    this.name = 'ScriptError';
    this.issues = Object.freeze(issues.map((i) => Object.freeze({ path: i.path, message: i.message })));
  }
}
