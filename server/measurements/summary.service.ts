import { grainSizeFromIntercept, isoIndexFromAstm } from '../../shared/measurements/e112';
import type {
  AcrossFields,
  Direction,
  InterceptFigures,
  InterceptSummary,
  PointCountSummary,
  SpecimenMeasurementSummary,
  ThicknessSummary,
} from '../../shared/measurements/measurement-records';
import { RESEARCH_CAUTION } from '../../shared/measurements/measurements';
import { fieldStatistics, RELATIVE_ACCURACY_LIMIT_PCT } from '../../shared/measurements/statistics';
import type { AppContext } from '../app-context';
import { Specimen } from '../archive/specimen.entity';
import { AppError } from '../http/app-error';
import { staleness } from './measurement.mapper';
import { currentShapes, sourceChanges } from './measurement-sources';
import { Measurement } from './measurement.entity';

/** E112 and E562 ask for at least this many fields. */
const MIN_FIELDS = 5;
const DIRECTION_ORDER: Direction[] = ['all', 'along', 'across', 'oblique'];

/** One field's contribution to a group: its value and what the group needs to say about it. */
interface Entry {
  value: number | null;
  stale: boolean;
}

/** Across-field statistics of a specimen's measurements, grouped by where they were taken (and direction, phase). */
export class SummaryService {
  constructor(private readonly ctx: AppContext) {}

  /** Every measurement on the specimen's images, oldest first, with its image (for CSV rows and staleness). */
  async fields(projectId: string, specimenId: string): Promise<{ specimen: Specimen; rows: Measurement[] }> {
    const specimen = await this.ctx.dataSource.getRepository(Specimen).findOneBy({ id: specimenId, projectId });
    if (!specimen) throw AppError.notFound('The specimen');
    const rows = await this.ctx.dataSource
      .getRepository(Measurement)
      .createQueryBuilder('m')
      .innerJoinAndSelect('m.image', 'i')
      .innerJoinAndSelect('m.author', 'a')
      .where('i.specimen_id = :specimenId AND m.project_id = :projectId', { specimenId, projectId })
      .orderBy('i.uploaded_at', 'ASC')
      .addOrderBy('m.created_at', 'ASC')
      .getMany();
    return { specimen, rows };
  }

  /** Whether each row's result is out of date: pixel size, or the shapes and point count it used (read once for all rows). */
  async staleTest(rows: readonly Measurement[]): Promise<(m: Measurement) => boolean> {
    const now = await currentShapes(this.ctx.dataSource.manager, rows.map((m) => m.imageId));
    return (m) => staleness(m.umPerPx, m.image.pixelSizeUm, sourceChanges(m.layout.sources, m.imageId, now)) !== null;
  }

  async summary(projectId: string, specimenId: string): Promise<SpecimenMeasurementSummary> {
    const { specimen, rows } = await this.fields(projectId, specimenId);
    const stale = await this.staleTest(rows);
    type Place = { where: string; band: number | null; distanceUm: { min: number; max: number } | null };
    const intercepts = new Map<string, Place & { direction: Direction; phase: string | null; entries: (Entry & { figures: InterceptFigures; symbol: 'P' | 'N' })[] }>();
    const points = new Map<string, { where: string; phaseName: string; entries: (Entry & { gridPoints: number })[] }>();
    const thickness = new Map<string, { where: string; entries: Entry[] }>();
    for (const m of rows) {
      const r = m.result;
      if (r.kind === 'intercept') {
        const where = m.definition.where;
        const band = where.type === 'band' ? where.band : null;
        const place: Place = { where: m.whereLabel, band, distanceUm: where.type === 'band' && 'distanceUm' in where ? (where.distanceUm ?? null) : null };
        // A sub-band measured alone belongs with the sub-bands of whole fields at the same distances: all its
        // lines pooled, like theirs. A layer or region keeps a row per direction.
        const parts: [Place, Direction, InterceptFigures][] = place.distanceUm ? [[place, 'all', r]] : [[place, r.direction, r]];
        if (r.byDirection && !place.distanceUm) parts.push([place, 'along', r.byDirection.along], [place, 'across', r.byDirection.across]);
        // Each sub-band of a whole field is a field of its own group; the whole field counts once, in its layer's rows.
        for (const bin of r.bins ?? []) parts.push([{ where: `${m.whereLabel}, ${bin.minUm}–${bin.maxUm} µm from the nearest bond interface`, band, distanceUm: { min: bin.minUm, max: bin.maxUm } }, 'all', bin]);
        for (const [at, direction, figures] of parts) {
          const phase = r.phase?.name ?? null;
          const key = `${at.where}|${direction}|${phase ?? ''}`;
          if (!intercepts.has(key)) intercepts.set(key, { ...at, direction, phase, entries: [] });
          intercepts.get(key)!.entries.push({ value: figures.meanInterceptUm, stale: stale(m), figures, symbol: r.countSymbol });
        }
      } else if (r.kind === 'point_count') {
        const key = `${m.whereLabel}|${r.phaseName}`;
        if (!points.has(key)) points.set(key, { where: m.whereLabel, phaseName: r.phaseName, entries: [] });
        points.get(key)!.entries.push({ value: r.pointFraction, stale: stale(m), gridPoints: r.gridPoints });
      } else {
        if (!thickness.has(m.whereLabel)) thickness.set(m.whereLabel, { where: m.whereLabel, entries: [] });
        thickness.get(m.whereLabel)!.entries.push({ value: r.meanUm, stale: stale(m) });
      }
    }

    const interceptRows: InterceptSummary[] = [];
    for (const g of intercepts.values()) {
      const base = groupBase(g.where, g.entries, 'l̄');
      if (!base) continue;
      const { stats, ...common } = base;
      const counted = g.entries.filter((e) => e.value !== null);
      const gAstm = grainSizeFromIntercept(stats.mean); // from the mean l̄, never a mean of G (E112)
      interceptRows.push({
        ...common,
        direction: g.direction,
        band: g.band,
        distanceUm: g.distanceUm,
        phase: g.phase,
        meanIntercept: stats,
        g: gAstm,
        gIso: isoIndexFromAstm(gAstm),
        totalCount: counted.reduce((a, e) => a + e.figures.count, 0),
        totalLineLengthUm: counted.reduce((a, e) => a + e.figures.lineLengthUm, 0),
        countSymbols: [...new Set(counted.map((e) => e.symbol))].sort(),
        anisotropyIndex: null,
      });
    }
    // The anisotropy index sits on the 'along' row: l̄ along the interfaces over l̄ across them, same place and phase.
    for (const along of interceptRows.filter((r) => r.direction === 'along')) {
      const across = interceptRows.find((r) => r.direction === 'across' && r.where === along.where && r.phase === along.phase);
      if (across) along.anisotropyIndex = along.meanIntercept.mean / across.meanIntercept.mean;
    }
    interceptRows.sort((a, b) => byWhere(a.where, b.where) || DIRECTION_ORDER.indexOf(a.direction) - DIRECTION_ORDER.indexOf(b.direction) || (a.phase ?? '').localeCompare(b.phase ?? ''));

    const pointRows: PointCountSummary[] = [];
    for (const g of points.values()) {
      const base = groupBase(g.where, g.entries, 'P_p');
      if (!base) continue;
      const { stats, ...common } = base;
      pointRows.push({ ...common, phaseName: g.phaseName, pointFraction: stats, totalGridPoints: g.entries.reduce((a, e) => a + e.gridPoints, 0) });
    }
    pointRows.sort((a, b) => byWhere(a.where, b.where) || a.phaseName.localeCompare(b.phaseName));

    const thicknessRows: ThicknessSummary[] = [];
    for (const g of thickness.values()) {
      const base = groupBase(g.where, g.entries, 'thickness');
      if (!base) continue;
      const { stats, ...common } = base;
      thicknessRows.push({ ...common, thickness: stats });
    }
    thicknessRows.sort((a, b) => byWhere(a.where, b.where));

    return { specimenId, specimenCode: specimen.code, intercepts: interceptRows, pointCounts: pointRows, thickness: thicknessRows, caution: RESEARCH_CAUTION };
  }
}

/** Statistics and warnings shared by every kind of group; null when no field has a value yet. */
function groupBase(where: string, entries: readonly Entry[], what: string): { where: string; staleFields: number; emptyFields: number; warnings: string[]; stats: AcrossFields } | null {
  const values = entries.filter((e) => e.value !== null).map((e) => e.value!);
  if (values.length === 0) return null;
  const stats = acrossFields(values);
  const staleFields = entries.filter((e) => e.stale).length;
  const emptyFields = entries.length - values.length;
  const warnings: string[] = [];
  if (values.length < MIN_FIELDS) warnings.push(`Only ${values.length} field${values.length > 1 ? 's' : ''}; measure at least ${MIN_FIELDS}, chosen without looking at the structure.`);
  if (stats.relativeAccuracyPct !== null && stats.relativeAccuracyPct > RELATIVE_ACCURACY_LIMIT_PCT) {
    warnings.push(`The relative accuracy of ${what} is ${stats.relativeAccuracyPct.toFixed(1)} %, above ${RELATIVE_ACCURACY_LIMIT_PCT} %: measure more fields.`);
  }
  if (staleFields > 0) warnings.push(`${staleFields} field${staleFields > 1 ? 's were' : ' was'} measured at a pixel size or on shapes that have changed since; recompute ${staleFields > 1 ? 'them' : 'it'}.`);
  if (emptyFields > 0) warnings.push(`${emptyFields} field${emptyFields > 1 ? 's have' : ' has'} nothing counted yet and ${emptyFields > 1 ? 'are' : 'is'} left out.`);
  return { where, staleFields, emptyFields, warnings, stats };
}

/** fieldStatistics for two or more fields; a single field has a mean and nothing else. */
export function acrossFields(values: readonly number[]): AcrossFields {
  if (values.length === 1) return { n: 1, mean: values[0]!, s: null, ci95: null, relativeAccuracyPct: null, relativeAccuracyWarning: true };
  const s = fieldStatistics(values);
  return { ...s, relativeAccuracyWarning: s.relativeAccuracyPct > RELATIVE_ACCURACY_LIMIT_PCT };
}

/** Whole image first, then bands by number (sub-bands after their band), then regions. */
function byWhere(a: string, b: string): number {
  const rank = (w: string) => (w === 'whole image' ? [0, 0] : w.startsWith('band ') ? [1, parseInt(w.slice(5), 10)] : [2, 0]);
  const [ra, rb] = [rank(a), rank(b)];
  return ra[0]! - rb[0]! || ra[1]! - rb[1]! || a.localeCompare(b);
}
