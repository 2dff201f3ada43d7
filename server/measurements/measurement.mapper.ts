import type { Measurement as MeasurementDto, MeasurementHistoryEntry, MeasurementResult, StaleNote } from '../../shared/measurements/measurement-records';
import { sourceChanges, type CurrentShapes } from './measurement-sources';
import type { MeasurementHistory } from './measurement-history.entity';
import type { Measurement } from './measurement.entity';

/** A pixel size as people read it: enough digits to tell two calibrations apart, no float noise. */
export function formatUmPerPx(v: number): string {
  return String(Number(v.toPrecision(6)));
}

/**
 * Set when the image's pixel size is no longer the one the result was computed with, or when
 * `changes` name shapes or a point count that changed since (see measurement-sources.ts).
 */
export function staleness(measuredUmPerPx: number, imageUmPerPx: number | null, changes: readonly string[] = []): StaleNote | null {
  const samePixel = imageUmPerPx !== null && Math.abs(imageUmPerPx - measuredUmPerPx) <= 1e-9 * measuredUmPerPx;
  if (samePixel && changes.length === 0) return null;
  const now = imageUmPerPx === null ? 'the image now has no pixel size (calibrate it, then recompute)' : `the image now has ${formatUmPerPx(imageUmPerPx)} µm/px; recompute to update the result`;
  const pixel = samePixel ? '' : `Measured at ${formatUmPerPx(measuredUmPerPx)} µm/px; ${now}.`;
  const message = changes.length === 0 ? pixel : [pixel, `Since this result was computed: ${changes.join(' ')}`, 'Recompute to count on the shapes as they are now; the old result stays in the history.'].filter(Boolean).join(' ');
  return { measuredUmPerPx, imageUmPerPx, changes: [...changes], message };
}

/** Expects `author` and `image` loaded; `now` holds the image's current shapes and point counts. */
export function toMeasurementDto(m: Measurement, now: CurrentShapes): MeasurementDto {
  return {
    id: m.id,
    projectId: m.projectId,
    imageId: m.imageId,
    specimenId: m.image.specimenId,
    kind: m.kind,
    definition: m.definition,
    whereLabel: m.whereLabel,
    testLines: m.layout.counted.testLines,
    gridPoints: m.layout.counted.grid,
    pixelSize: { umPerPx: m.umPerPx, source: m.pixelSizeSource },
    result: m.result,
    stale: staleness(m.umPerPx, m.image.pixelSizeUm, sourceChanges(m.layout.sources, m.imageId, now)),
    authorId: m.authorId,
    authorName: m.author.displayName,
    createdAt: m.createdAt.toISOString(),
    updatedAt: m.updatedAt.toISOString(),
    computedAt: m.computedAt.toISOString(),
    version: m.version,
  };
}

/** Expects `replacer` loaded. */
export function toHistoryEntry(h: MeasurementHistory): MeasurementHistoryEntry {
  return {
    version: h.version,
    reason: h.reason,
    umPerPx: h.umPerPx,
    pixelSizeSource: h.pixelSizeSource,
    result: h.result,
    replacedAt: h.replacedAt.toISOString(),
    replacedByName: h.replacer.displayName,
  };
}

/** A result in a few words, for the activity history: "l̄ 20.0 µm, G 8.0", "P_p 0.149", "thickness 200 µm". */
export function describeResult(r: MeasurementResult): string {
  if (r.kind === 'intercept') return r.meanInterceptUm === null || r.g === null ? 'nothing counted yet' : `l̄ ${r.meanInterceptUm.toPrecision(3)} µm, G ${r.g.toFixed(1)}`;
  if (r.kind === 'point_count') return `P_p ${r.pointFraction.toFixed(3)} of ${r.phaseName}`;
  return `thickness ${r.meanUm.toPrecision(3)} µm`;
}

/** How a kind reads in a sentence. */
export const KIND_WORDS = { intercept: 'grain size by intercepts', point_count: 'a point count', thickness: 'layer thickness' } as const;
