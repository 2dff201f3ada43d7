import type { EntityManager } from 'typeorm';
import type { PanelSpec } from '../../shared/figures';

/**
 * Where each panel of a figure went when its panels were edited, so threads pinned to a panel (by its
 * place) follow it. A panel showing the same image and region is the same panel wherever it now stands;
 * an unmatched panel whose place still shows the same image was edited there (a new region, say); any
 * other is gone (null). Pure.
 */
export function panelMoves(before: readonly PanelSpec[], after: readonly PanelSpec[]): (number | null)[] {
  const key = (p: PanelSpec) => `${p.imageId} ${p.region.x} ${p.region.y} ${p.region.width} ${p.region.height}`;
  const taken = new Set<number>();
  const moves: (number | null)[] = before.map((p) => {
    const at = after.findIndex((q, i) => !taken.has(i) && key(q) === key(p));
    if (at < 0) return null;
    taken.add(at);
    return at;
  });
  return moves.map((to, i) => {
    if (to !== null) return to;
    const same = after[i];
    if (same && !taken.has(i) && same.imageId === before[i]!.imageId) {
      taken.add(i);
      return i;
    }
    return null;
  });
}

/** Re-pins the figure's panel threads after an edit of its panels: to the panel's new place, or to the whole figure when it is gone. */
export async function followPanelThreads(m: EntityManager, figureId: string, before: readonly PanelSpec[], after: readonly PanelSpec[]): Promise<void> {
  const moves = panelMoves(before, after);
  const threads: { id: string; anchor: { kind: 'panel'; panel: number } }[] = await m.query(
    `SELECT id, anchor FROM comment_threads WHERE figure_id = $1 AND anchor_kind = 'panel' FOR UPDATE`,
    [figureId],
  );
  for (const t of threads) {
    const to = moves[t.anchor.panel] ?? null;
    if (to === t.anchor.panel) continue;
    const anchor = to === null ? { kind: 'figure' as const } : { kind: 'panel' as const, panel: to };
    await m.query(`UPDATE comment_threads SET anchor = $2, anchor_kind = $3 WHERE id = $1`, [t.id, JSON.stringify(anchor), anchor.kind]);
  }
}
