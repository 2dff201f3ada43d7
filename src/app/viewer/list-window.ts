/**
 * Which rows of a long list of equal-height rows to put in the page: the ones in the scrolled
 * window plus a few on either side, with spacers standing in for the rest. Two thousand
 * annotations stay a few dozen elements. Pure.
 */
export interface ListWindow {
  start: number;
  /** One past the last row to render. */
  end: number;
  padTop: number;
  padBottom: number;
}

export function listWindow(scrollTop: number, viewportHeight: number, rowHeight: number, count: number, overscan = 6): ListWindow {
  if (count === 0 || rowHeight <= 0) return { start: 0, end: 0, padTop: 0, padBottom: 0 };
  const first = Math.floor(Math.max(0, scrollTop) / rowHeight);
  const visible = Math.ceil(Math.max(viewportHeight, rowHeight) / rowHeight) + 1;
  const start = Math.max(0, Math.min(count - 1, first - overscan));
  const end = Math.min(count, first + visible + overscan);
  return { start, end, padTop: start * rowHeight, padBottom: (count - end) * rowHeight };
}

/** The scroll position that brings row `index` into view, or null when it is in view already. */
export function scrollToRow(index: number, scrollTop: number, viewportHeight: number, rowHeight: number): number | null {
  const top = index * rowHeight;
  if (top < scrollTop) return top;
  if (top + rowHeight > scrollTop + viewportHeight) return top + rowHeight - viewportHeight;
  return null;
}
