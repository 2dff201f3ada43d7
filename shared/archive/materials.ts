import { z } from 'zod';
import { compositionSchema, type Composition } from './composition';

/** An alloy used in a project's samples. */
export interface Material {
  id: string;
  projectId: string;
  designation: string;
  /** Free text; the form suggests `MATERIAL_CLASS_SUGGESTIONS`. */
  materialClass: string;
  composition: Composition;
  notes: string;
  /** How many sample layers use it; a material in use cannot be deleted. */
  usedInSamples: number;
  createdAt: string;
  updatedAt: string;
}

export const MATERIAL_CLASS_SUGGESTIONS = [
  'austenitic, twinning',
  'austenitic, transforming',
  'austenitic, stable',
  'ferritic',
  'ferritic-martensitic',
  'martensitic',
  'duplex',
  'interstitial-free',
  'aluminium alloy',
  'nickel alloy',
  'titanium alloy',
];

const designation = z.string().trim().min(1, { error: 'Enter a designation.' }).max(60, { error: 'Use at most 60 characters.' });

export const createMaterialBody = z.strictObject({
  designation,
  materialClass: z.string().trim().max(80, { error: 'Use at most 80 characters.' }).default(''),
  composition: compositionSchema.default({ wtPct: {}, balance: null }),
  notes: z.string().trim().max(4000).default(''),
});
export type CreateMaterialBody = z.infer<typeof createMaterialBody>;

export const updateMaterialBody = createMaterialBody.partial();
export type UpdateMaterialBody = z.infer<typeof updateMaterialBody>;

export const materialParams = z.strictObject({
  projectId: z.uuid({ error: 'Not a valid project id.' }),
  materialId: z.uuid({ error: 'Not a valid material id.' }),
});
