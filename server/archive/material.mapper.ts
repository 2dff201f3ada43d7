import type { Material as MaterialDto } from '../../shared/archive/materials';
import type { Material } from './material.entity';

export function toMaterialDto(m: Material, usedInSamples: number): MaterialDto {
  return {
    id: m.id,
    projectId: m.projectId,
    designation: m.designation,
    materialClass: m.materialClass,
    composition: m.composition,
    notes: m.notes,
    usedInSamples,
    createdAt: m.createdAt.toISOString(),
    updatedAt: m.updatedAt.toISOString(),
  };
}
