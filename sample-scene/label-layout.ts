// Keeps the range's labels readable: after the label renderer has placed them, labels that overlap are pushed down
// below each other, and labels that would run past the right edge of the range (under the panel) are pulled in.

/** Gap between stacked labels, px. */
const GAP = 3;

/** Lays out `labels` (the CSS2D label elements) inside `host` (the range's element). */
export function layoutLabels(host: HTMLElement, labels: readonly HTMLElement[]): void {
  const box = host.getBoundingClientRect();
  const shown: { el: HTMLElement; r: DOMRect }[] = [];
  for (const el of labels) {
    el.style.marginTop = '0px';
    el.style.marginLeft = '0px';
  }
  for (const el of labels) {
    if (el.style.display === 'none') continue;
    shown.push({ el, r: el.getBoundingClientRect() });
  }
  shown.sort((a, b) => a.r.top - b.r.top || a.r.left - b.r.left);
  const placed: { left: number; right: number; top: number; bottom: number }[] = [];
  for (const { el, r } of shown) {
    let dx = 0;
    if (r.right > box.right - 4) dx = box.right - 4 - r.right;
    if (r.left + dx < box.left + 4) dx = box.left + 4 - r.left;
    const left = r.left + dx;
    const right = r.right + dx;
    let top = r.top;
    for (let moved = true; moved; ) {
      moved = false;
      for (const p of placed) {
        if (left < p.right && right > p.left && top < p.bottom + GAP && top + r.height > p.top - GAP) {
          top = p.bottom + GAP;
          moved = true;
        }
      }
    }
    placed.push({ left, right, top, bottom: top + r.height });
    if (dx !== 0) el.style.marginLeft = `${dx.toFixed(0)}px`;
    if (top !== r.top) el.style.marginTop = `${(top - r.top).toFixed(0)}px`;
  }
}

/** The label under or nearest to the point (client px) within `reach` px, or null. */
export function labelAt<T>(x: number, y: number, labels: readonly { label: HTMLElement; value: T }[], reach = 160): T | null {
  let best: T | null = null;
  let bestD = reach;
  for (const { label, value } of labels) {
    if (label.style.display === 'none') continue;
    const r = label.getBoundingClientRect();
    const dx = Math.max(r.left - x, 0, x - r.right);
    const dy = Math.max(r.top - y, 0, y - r.bottom);
    const d = Math.hypot(dx, dy);
    if (d < bestD) (bestD = d), (best = value);
  }
  return best;
}
