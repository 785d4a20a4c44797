// The panel's place on any page: a column fixed to the right edge that the designer can widen or narrow by its
// left edge and fold away to a thin strip. Its width is published as the CSS variable --rl-dock-width on the root
// element so that a page can keep its own content clear of it; the width and the fold are remembered.

/** Frozen defaults of EditorDock. */
export const editorDockDefaults = Object.freeze({ windowShare: 0.22, minWidth: 280, maxWidth: 720, foldedWidth: 30, storageKey: 'ralenti.editor.dock' });

/** The dock: `body` holds the panel and scrolls. */
export class EditorDock {
  /** The dock element (fixed to the right edge). */
  readonly element: HTMLElement;
  /** Scrolling element the panel is built in. */
  readonly body: HTMLDivElement;
  /** Width when open, px. */
  width: number;
  /** True while folded to a strip. */
  folded = false;
  private readonly fold: HTMLButtonElement;
  private readonly storage: Storage | undefined;
  private readonly off: () => void;
  /** True once the designer has chosen a width (then window resizes leave it alone). */
  private sized: boolean;

  constructor(doc: Document, parent: HTMLElement, storage?: Storage) {
    this.storage = storage;
    const d = editorDockDefaults;
    const saved = this.read();
    this.sized = saved.width !== undefined;
    this.width = clamp(saved.width ?? defaultDockWidth(doc.defaultView?.innerWidth ?? 1280), d.minWidth, d.maxWidth);
    this.folded = saved.folded ?? false;
    this.element = doc.createElement('aside');
    this.element.className = 'rl-dock';
    this.element.setAttribute('aria-label', 'Ralenti tuning panel');
    const grip = doc.createElement('div');
    grip.className = 'rl-dock-grip';
    grip.title = `Drag to resize the panel (${d.minWidth}…${d.maxWidth} px).`;
    grip.setAttribute('role', 'separator');
    grip.setAttribute('aria-orientation', 'vertical');
    this.fold = doc.createElement('button');
    this.fold.type = 'button';
    this.fold.className = 'rl-dock-fold';
    this.fold.addEventListener('click', () => this.setFolded(!this.folded));
    this.body = doc.createElement('div');
    this.body.className = 'rl-dock-body';
    this.element.append(grip, this.fold, this.body);
    parent.appendChild(this.element);
    let dragging = false;
    const move = (e: PointerEvent) => {
      if (!dragging) return;
      const right = doc.documentElement.clientWidth;
      this.setWidth(right - e.clientX);
    };
    const up = () => {
      if (dragging) this.write();
      dragging = false;
      this.element.classList.remove('rl-dock-resizing');
    };
    grip.addEventListener('pointerdown', (e) => {
      dragging = true;
      this.sized = true;
      this.element.classList.add('rl-dock-resizing');
      e.preventDefault();
    });
    // Until the designer picks a width, the dock follows the window's size.
    const follow = () => {
      const w = defaultDockWidth(doc.defaultView?.innerWidth ?? 1280);
      if (!this.sized && w !== this.width) this.setWidth(w);
    };
    doc.addEventListener('pointermove', move);
    doc.addEventListener('pointerup', up);
    doc.defaultView?.addEventListener('resize', follow);
    this.off = () => {
      doc.removeEventListener('pointermove', move);
      doc.removeEventListener('pointerup', up);
      doc.defaultView?.removeEventListener('resize', follow);
    };
    this.apply();
  }

  /** Sets the open width in px (clamped to 280…720). */
  setWidth(px: number): void {
    this.width = clamp(Math.round(px), editorDockDefaults.minWidth, editorDockDefaults.maxWidth);
    this.apply();
  }

  /** Folds the dock to a strip or opens it. */
  setFolded(folded: boolean): void {
    this.folded = folded;
    this.apply();
    this.write();
  }

  /** Removes the dock and clears --rl-dock-width. */
  dispose(): void {
    this.off();
    this.element.ownerDocument.documentElement.style.removeProperty('--rl-dock-width');
    this.element.remove();
  }

  private apply(): void {
    const w = this.folded ? editorDockDefaults.foldedWidth : this.width;
    this.element.style.width = `${w}px`;
    this.element.classList.toggle('rl-dock-folded', this.folded);
    this.fold.textContent = this.folded ? '‹' : '›';
    this.fold.title = this.folded ? 'Open the tuning panel.' : 'Fold the tuning panel away to the edge.';
    this.fold.setAttribute('aria-expanded', String(!this.folded));
    this.element.ownerDocument.documentElement.style.setProperty('--rl-dock-width', `${w}px`);
    this.element.ownerDocument.defaultView?.dispatchEvent(new Event('resize'));
  }

  private read(): { width?: number; folded?: boolean } {
    try {
      const v = JSON.parse(this.storage?.getItem(editorDockDefaults.storageKey) ?? '{}') as { width?: unknown; folded?: unknown };
      return { width: typeof v.width === 'number' ? v.width : undefined, folded: typeof v.folded === 'boolean' ? v.folded : undefined };
    } catch {
      return {};
    }
  }

  private write(): void {
    try {
      this.storage?.setItem(editorDockDefaults.storageKey, JSON.stringify({ width: this.width, folded: this.folded }));
    } catch {
      // Storage refused: the dock simply forgets.
    }
  }
}

/** The dock's width before the designer picks one, px: about a fifth of the window, 300 px at 1024 wide to 480 px at 2560. */
export function defaultDockWidth(windowWidth: number): number {
  return clamp(Math.round(windowWidth * editorDockDefaults.windowShare), 300, 480);
}

function clamp(v: number, lo: number, hi: number): number {
  return Math.min(hi, Math.max(lo, v));
}
