import type { AcrossFields, InterceptFigures, SpecimenMeasurementSummary } from '../../shared/measurements/measurement-records';
import { RESEARCH_CAUTION } from '../../shared/measurements/measurements';
import { formatUmPerPx } from './measurement.mapper';
import type { Measurement } from './measurement.entity';

/**
 * CSV exports: one header row with units, one row per line of data, then the research caution.
 * RFC 4180 quoting; a byte-order mark so spreadsheet programs read µm and mm⁻¹ as UTF-8.
 */

type Cell = string | number | boolean | null;

/** Text cells that a spreadsheet would run as a formula get a leading apostrophe (names and labels come from people). */
function cell(v: Cell): string {
  if (v === null) return '';
  if (typeof v === 'boolean') return v ? 'yes' : 'no';
  let s = typeof v === 'number' ? String(v) : v;
  if (typeof v === 'string' && /^[=+\-@\t\r]/.test(s)) s = `'${s}`;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

function table(header: string[], rows: Cell[][]): string {
  const lines = [header, ...rows].map((r) => r.map(cell).join(','));
  return `\uFEFF${lines.join('\r\n')}\r\n\r\n${cell(`Note: ${RESEARCH_CAUTION}`)}\r\n`;
}

/** Significant digits for measured values (more than the data carry, fewer than float noise). */
const sig = (v: number | null | undefined, digits = 5): number | null => (v === null || v === undefined ? null : Number(v.toPrecision(digits)));
/** G is reported to the nearest 0.1 (E112 reporting). */
const tenth = (v: number | null | undefined): number | null => (v === null || v === undefined ? null : Math.round(v * 10) / 10);

const stats = (a: AcrossFields | null): Cell[] =>
  a ? [a.n, sig(a.mean), sig(a.s), sig(a.ci95), a.relativeAccuracyPct === null ? null : Number(a.relativeAccuracyPct.toFixed(1)), a.relativeAccuracyWarning] : [null, null, null, null, null, null];

/** GET …/summary.csv: one row per group, each kind's values in its own columns. */
export function summaryCsv(s: SpecimenMeasurementSummary): string {
  const header = [
    'Specimen', 'Quantity', 'Where', 'Direction', 'Phase', 'Fields (n)', 'Mean', 's', '95 % CI ± (same unit)', '%RA', '%RA above 10 %',
    'Unit', 'G (ASTM E112, from mean l̄)', 'G (ISO 643)', 'Total count (P or N)', 'Count type', 'Total line length (µm)',
    'Anisotropy index l̄∥/l̄⊥', 'Total grid points', 'Stale fields', 'Fields with nothing counted', 'Warnings',
  ];
  const rows: Cell[][] = [
    ...s.intercepts.map((g) => [
      s.specimenCode, 'mean lineal intercept l̄', g.where, g.direction, g.phase, ...stats(g.meanIntercept), 'µm', tenth(g.g), tenth(g.gIso),
      g.totalCount, g.countSymbols.join(' and '), sig(g.totalLineLengthUm, 7), sig(g.anisotropyIndex, 4), null, g.staleFields, g.emptyFields, g.warnings.join(' '),
    ]),
    ...s.pointCounts.map((g) => [
      s.specimenCode, `point fraction P_p of ${g.phaseName}`, g.where, null, g.phaseName, ...stats(g.pointFraction), '1 (fraction)', null, null,
      null, null, null, null, g.totalGridPoints, g.staleFields, g.emptyFields, g.warnings.join(' '),
    ]),
    ...s.thickness.map((g) => [
      s.specimenCode, 'layer thickness', g.where, null, null, ...stats(g.thickness), 'µm', null, null,
      null, null, null, null, null, g.staleFields, g.emptyFields, g.warnings.join(' '),
    ]),
  ];
  return table(header, rows);
}

/**
 * GET …/measurements.csv: every field, one row per direction for crossed lines, with how it was measured.
 * `specimenCode` names the specimen of every row, or of each row when the rows span specimens; `isStale`
 * says whether a row's result is out of date: pass `SummaryService.staleTest`, so every
 * table of results (summary, this CSV, the project ZIP, the CSV behind a figure) agrees.
 */
export function fieldsCsv(specimenCode: string | ((m: Measurement) => string), rows: readonly Measurement[], isStale: (m: Measurement) => boolean): string {
  const specimenOf = typeof specimenCode === 'string' ? () => specimenCode : specimenCode;
  const header = [
    'Specimen', 'Image', 'Measurement id', 'Kind', 'Where', 'Direction', 'Pattern', 'Count type', 'Triple point value', 'Twins excluded',
    'Phase', 'Volume fraction V_V', 'Pixel size (µm/px)', 'Pixel size source', 'Stale', 'Line length (µm)', 'Count (P or N)',
    'P_L or N_L (mm⁻¹)', 'Mean intercept l̄ (µm)', 'G (ASTM E112)', 'G (ISO 643)', 'Grid points P_T', 'Points inside', 'Points on boundary', 'P_p',
    'Mean thickness (µm)', 's thickness (µm)', 'Min thickness (µm)', 'Max thickness (µm)', 'Author', 'Computed at',
  ];
  const out: Cell[][] = [];
  for (const m of rows) {
    const r = m.result;
    const common: Cell[] = [specimenOf(m), m.image.originalName, m.id, m.kind, m.whereLabel];
    const tail: Cell[] = [formatUmPerPx(m.umPerPx), m.pixelSizeSource, isStale(m)];
    const end: Cell[] = [m.author.displayName, m.computedAt.toISOString()];
    if (r.kind === 'intercept' && m.definition.kind === 'intercept') {
      const parts: [string, InterceptFigures, string][] = [[r.direction, r, m.whereLabel]];
      if (r.byDirection) parts.push(['along', r.byDirection.along, m.whereLabel], ['across', r.byDirection.across, m.whereLabel]);
      // Sub-bands follow their field, one row each, all directions pooled.
      for (const bin of r.bins ?? []) parts.push(['all', bin, `${m.whereLabel}, ${bin.minUm}–${bin.maxUm} µm from the nearest bond interface`]);
      for (const [direction, f, where] of parts) {
        out.push([
          ...common.slice(0, 4), where, direction, describePattern(m.definition.pattern), r.countSymbol, r.rules.triplePoint, r.twinsExcluded, r.phase?.name ?? null, r.phase?.volumeFraction ?? null,
          ...tail, sig(f.lineLengthUm, 7), f.count, sig(f.perMm), sig(f.meanInterceptUm), tenth(f.g), tenth(f.gIso), null, null, null, null, null, null, null, null, ...end,
        ]);
      }
    } else if (r.kind === 'point_count') {
      out.push([...common, null, 'point grid', null, null, null, r.phaseName, null, ...tail, null, null, null, null, null, null, r.gridPoints, r.inside, r.onBoundary, sig(r.pointFraction), null, null, null, null, ...end]);
    } else if (r.kind === 'thickness') {
      out.push([...common, null, null, null, null, null, null, null, ...tail, null, null, null, null, null, null, null, null, null, null, sig(r.meanUm), sig(r.sUm), sig(r.minUm), sig(r.maxUm), ...end]);
    }
  }
  return table(header, out);
}

function describePattern(p: Extract<Measurement['definition'], { kind: 'intercept' }>['pattern']): string {
  if (p.type === 'circle') return `one circle, ${p.diameterUm} µm`;
  if (p.type === 'three_circles') return `three circles, largest ${p.largestDiameterUm} µm`;
  const dir = p.direction === 'angle' ? `at ${p.angleDeg ?? 45}°` : p.direction;
  return `${p.count} lines ${dir}, ${p.spacingUm} µm apart`;
}
