import type { InterceptFigures, MeasurementHistoryEntry, MeasurementResult } from '../../../shared/measurements/measurement-records';
import { formatCount, formatG, formatLength, formatPerMm, formatUm } from './measure-units';

/** One labelled number of a result, with its unit. */
export interface ResultRow {
  label: string;
  /** Set for quantities written with a subscript (P_L, N_L): label, then `sub` lowered. */
  sub?: string;
  value: string;
  /** 'Along' or 'Across' for a pattern laid both ways; unset for the field as a whole. */
  group?: string;
}

function interceptRows(f: InterceptFigures, symbol: 'P' | 'N', group?: string): ResultRow[] {
  const rows: ResultRow[] = [
    { label: 'Total test line length', value: formatLength(f.lineLengthUm) },
    { label: `${symbol} (${symbol === 'P' ? 'intersections' : 'intercepts'})`, value: formatCount(f.count) },
    { label: symbol, sub: 'L', value: formatPerMm(f.perMm) },
    { label: 'Mean lineal intercept l̄', value: formatUm(f.meanInterceptUm, 2) },
    { label: 'ASTM grain size G', value: formatG(f.g) },
  ];
  return group ? rows.map((r) => ({ ...r, group })) : rows;
}

/** A saved result as label/value rows with units, for the result card and the saved list. Pure. */
export function resultRows(r: MeasurementResult): ResultRow[] {
  if (r.kind === 'intercept') {
    const rows = interceptRows(r, r.countSymbol);
    if (r.byDirection) {
      rows.push(...interceptRows(r.byDirection.along, r.countSymbol, 'Along the interfaces'), ...interceptRows(r.byDirection.across, r.countSymbol, 'Across the interfaces'));
      if (r.byDirection.anisotropyIndex !== null) rows.push({ label: 'Anisotropy index l̄∥ / l̄⊥', value: r.byDirection.anisotropyIndex.toFixed(2) });
    }
    if (r.phase) {
      const from = r.phase.pointCount ? `from the point count of ${r.phase.pointCount.phaseName} on ${r.phase.pointCount.whereLabel}, version ${r.phase.pointCount.version}` : 'typed in';
      rows.splice(4, 0, { label: `Volume fraction of ${r.phase.name} V`, sub: 'V', value: `${r.phase.volumeFraction.toFixed(3)} (${from})` });
    }
    for (const bin of r.bins ?? []) {
      const group = subBandTitle(bin.minUm, bin.maxUm);
      rows.push(...interceptRows(bin, r.countSymbol, group), { label: 'Confirmed marks in this sub-band', value: String(bin.marks), group });
    }
    return rows;
  }
  if (r.kind === 'point_count') {
    return [
      { label: 'Grid points P', sub: 'T', value: String(r.gridPoints) },
      { label: 'Inside / on a boundary', value: `${r.inside} / ${r.onBoundary}` },
      { label: `Point fraction (${r.phaseName}) P`, sub: 'p', value: `${(r.pointFraction * 100).toFixed(1)} %` },
    ];
  }
  return [
    { label: `Mean thickness of band ${r.band}`, value: formatUm(r.meanUm, 2) },
    { label: 'Standard deviation', value: formatUm(r.sUm, 2) },
    { label: 'Range', value: `${formatUm(r.minUm, 1)} – ${formatUm(r.maxUm, 1)}` },
    { label: 'Samples', value: `${r.samplesUm.length}, every ${formatUm(r.spacingUm, 1)}` },
  ];
}

/** "Sub-band 0–20 µm from the nearest interface". Pure. */
export function subBandTitle(minUm: number, maxUm: number): string {
  return `Sub-band ${minUm}–${maxUm}\u00a0µm from the nearest interface`;
}

/** The one-line gist of a result for a list. Pure. */
export function resultGist(r: MeasurementResult): string {
  if (r.kind === 'intercept') return `${r.countSymbol} = ${formatCount(r.count)}, l̄ = ${formatUm(r.meanInterceptUm, 2)}, G = ${formatG(r.g)}`;
  if (r.kind === 'point_count') return `point fraction ${(r.pointFraction * 100).toFixed(1)} % ${r.phaseName}`;
  return `thickness ${formatUm(r.meanUm, 2)} ± ${formatUm(r.sUm, 2)}`;
}

/** Rows gathered by group, in order of first appearance (the whole field first). Pure. */
export function groupRows(rows: readonly ResultRow[]): { title: string; rows: ResultRow[] }[] {
  const groups: { title: string; rows: ResultRow[] }[] = [];
  for (const row of rows) {
    const title = row.group ?? '';
    let g = groups.find((x) => x.title === title);
    if (!g) groups.push((g = { title, rows: [] }));
    g.rows.push(row);
  }
  return groups;
}

const REASON_WORDS: Record<MeasurementHistoryEntry['reason'], string> = { edited: 'replaced by an edit', recomputed: 'replaced by a recompute', deleted: 'deleted' };

/** One earlier result: "Version 1, replaced by a recompute (Ana): P = 3, l̄ = 130.00 µm, G = 2.6 at 0.5 µm/px". Pure. */
export function historyLine(h: MeasurementHistoryEntry): string {
  return `Version ${h.version}, ${REASON_WORDS[h.reason]} (${h.replacedByName}): ${resultGist(h.result)} at ${Number(h.umPerPx.toPrecision(6))}\u00a0µm/px`;
}
