import type { InterceptSummary } from '../../../shared/measurements/measurement-records';

/** What the l̄ plot draws per summary row: a label, the mean and its 95 % interval (µm). */
export interface InterceptBar {
  label: string;
  mean: number;
  low: number;
  high: number;
}

const DIRECTION_WORDS: Record<InterceptSummary['direction'], string> = { along: 'along', across: 'across', oblique: 'oblique', all: 'all directions' };

/** "band 2 · along"; the direction reads in words. Pure. */
export function rowLabel(row: Pick<InterceptSummary, 'where' | 'direction' | 'phase'>): string {
  return `${row.where} · ${DIRECTION_WORDS[row.direction]}${row.phase ? ` · ${row.phase}` : ''}`;
}

/**
 * The rows of the main table and plot: one per layer (or whole image, region) and direction, each field in it
 * once with its whole totals. Sub-band rows have a table of their own (`subBandRows`). Pure.
 */
export function layerRows(rows: readonly InterceptSummary[]): InterceptSummary[] {
  return rows.filter((r) => r.distanceUm === null);
}

/** Bars for the plot: one per band and direction; a single field has no interval, so its bar is the mean alone. Pure. */
export function interceptBars(rows: readonly InterceptSummary[]): InterceptBar[] {
  return rows
    .filter((r) => r.meanIntercept.n > 0 && Number.isFinite(r.meanIntercept.mean))
    .map((r) => {
      const ci = r.meanIntercept.ci95 ?? 0;
      return { label: rowLabel(r), mean: r.meanIntercept.mean, low: Math.max(0, r.meanIntercept.mean - ci), high: r.meanIntercept.mean + ci };
    });
}

/** A sub-band row's place without its distance: "band 2", "region “near bond”". Pure. */
export function placeOfSubBand(row: Pick<InterceptSummary, 'where'>): string {
  return row.where.replace(/, [\d.]+–[\d.]+ µm from the nearest bond interface$/, '');
}

/**
 * Bars for the plot across the distance from the interfaces: one per sub-band row (all directions pooled),
 * grouped by place and ordered outwards from the interface. Pure.
 */
export function distanceBars(rows: readonly InterceptSummary[]): InterceptBar[] {
  return subBandRows(rows).map((r) => {
    const ci = r.meanIntercept.ci95 ?? 0;
    return { label: subBandLabel(r), mean: r.meanIntercept.mean, low: Math.max(0, r.meanIntercept.mean - ci), high: r.meanIntercept.mean + ci };
  });
}

/** The sub-band rows of a summary (all directions pooled), grouped by place and ordered outwards. Pure. */
export function subBandRows(rows: readonly InterceptSummary[]): InterceptSummary[] {
  return rows
    .filter((r) => r.distanceUm !== null && r.direction === 'all' && r.meanIntercept.n > 0 && Number.isFinite(r.meanIntercept.mean))
    .slice()
    .sort((a, b) => placeOfSubBand(a).localeCompare(placeOfSubBand(b)) || a.distanceUm!.min - b.distanceUm!.min || (a.phase ?? '').localeCompare(b.phase ?? ''));
}

/** "band 1 · 0–20 µm", with the phase when there is one. Pure. */
export function subBandLabel(r: InterceptSummary): string {
  return `${placeOfSubBand(r)} · ${r.distanceUm!.min}–${r.distanceUm!.max} µm${r.phase ? ` · ${r.phase}` : ''}`;
}
