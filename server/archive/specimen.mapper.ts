import type { Location, Specimen as SpecimenDto } from '../../shared/archive/specimens';
import { stepLabel } from './sample.mapper';
import type { SpecimenLocation } from './specimen-location.entity';
import type { Specimen } from './specimen.entity';

export function toLocation(l: SpecimenLocation, imageCount: number): Location {
  return { id: l.id, specimenId: l.specimenId, name: l.name, xMm: l.xMm, yMm: l.yMm, imageCount };
}

/** Expects `sample`, `afterStep` and `locations` loaded; `imageCounts` maps location id → images filed there. */
export function toSpecimenDto(s: Specimen, imageCounts: ReadonlyMap<string, number>): SpecimenDto {
  return {
    id: s.id,
    projectId: s.projectId,
    sampleId: s.sampleId,
    sampleCode: s.sample.code,
    code: s.code,
    afterStepId: s.afterStepId,
    afterStepLabel: stepLabel(s.afterStep),
    sectionPlane: s.sectionPlane,
    preparation: s.preparation,
    notes: s.notes,
    locations: [...s.locations].sort((a, b) => a.name.localeCompare(b.name)).map((l) => toLocation(l, imageCounts.get(l.id) ?? 0)),
    createdAt: s.createdAt.toISOString(),
    updatedAt: s.updatedAt.toISOString(),
  };
}
