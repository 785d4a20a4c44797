// One status line at the top of the panel: clamps, reverted text, undo steps and other notices, read aloud politely.

/** Shows one short notice at a time in an aria-live line; `kind` colours it. */
export class Announcer {
  /** The line's element (placed by the panel). */
  readonly element: HTMLDivElement;
  /** Last message shown ('' = none), for tests and the scene handle. */
  last = '';

  constructor(doc: Document) {
    this.element = doc.createElement('div');
    this.element.className = 'rl-notice';
    this.element.setAttribute('role', 'status');
    this.element.setAttribute('aria-live', 'polite');
  }

  /** Shows `message`; 'warn' for clamps and refused input, 'info' otherwise. */
  say(message: string, kind: 'info' | 'warn' = 'info'): void {
    this.last = message;
    this.element.textContent = message;
    this.element.dataset.kind = kind;
  }
}
