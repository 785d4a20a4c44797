// What a designer has open in the panel — folders, selected group, scroll position, selected curve keys — captured
// before the panel is rebuilt (load, reset, undo, compare) and put back after, so nothing jumps.
import type { FolderApi } from 'tweakpane';
import type { CurveBladeApi } from './curve-blade';

/** The panel's view state. */
export interface PanelViewState {
  /** Expanded flag by folder title. */
  folders: Record<string, boolean>;
  /** Selected group name (null: none yet). */
  group: string | null;
  /** Scroll offset of the scrolling element, px. */
  scrollTop: number;
  /** Selected key index by curve title. */
  curveKeys: Record<string, number>;
  /** Whether the whole pane is expanded. */
  paneExpanded: boolean;
}

/** An empty state (first build). */
export function emptyViewState(): PanelViewState {
  return { folders: {}, group: null, scrollTop: 0, curveKeys: {}, paneExpanded: true };
}

/** Reads the view state of the built panel. */
export function captureViewState(folders: readonly FolderApi[], group: string | null, scroller: HTMLElement | null, curves: readonly CurveBladeApi[], paneExpanded: boolean): PanelViewState {
  const s = emptyViewState();
  for (const f of folders) s.folders[f.title ?? ''] = f.expanded;
  s.group = group;
  s.scrollTop = scroller?.scrollTop ?? 0;
  for (const c of curves) s.curveKeys[c.element.dataset.curve ?? ''] = c.selectedIndex;
  s.paneExpanded = paneExpanded;
  return s;
}

/** Puts folder, curve-selection and scroll state back on a rebuilt panel. */
export function restoreViewState(s: PanelViewState, folders: readonly FolderApi[], scroller: HTMLElement | null, curves: readonly CurveBladeApi[]): void {
  for (const f of folders) {
    const e = s.folders[f.title ?? ''];
    if (e !== undefined) f.expanded = e;
  }
  for (const c of curves) {
    const i = s.curveKeys[c.element.dataset.curve ?? ''];
    if (i !== undefined) c.selectedIndex = i;
  }
  if (scroller) scroller.scrollTop = s.scrollTop;
}
