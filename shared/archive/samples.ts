import { z } from 'zod';
import { processStepSchema, type ProcessStep, type RouteState, type StackLayer } from './process-route';

/** A row of a project's sample list. */
export interface SampleSummary {
  id: string;
  projectId: string;
  code: string;
  name: string;
  /** Designations bottom to top, e.g. ["KV-T22", "KV-M9"]. */
  stack: string[];
  stepCount: number;
  specimenCount: number;
  updatedAt: string;
}

export interface SampleLayer extends StackLayer {
  designation: string;
}

/** The sample page: its stack, its route, and what the route implies after each step. */
export interface SampleDetail extends Omit<SampleSummary, 'stack'> {
  description: string;
  layers: SampleLayer[];
  route: ProcessStep[];
  /** `states[0]` is the initial stack; `states[i + 1]` follows `route[i]`. */
  states: RouteState[];
  createdAt: string;
}

const code = z
  .string()
  .trim()
  .regex(/^[A-Za-z0-9][A-Za-z0-9._-]{0,39}$/, { error: 'Use 1-40 letters, digits, dots, hyphens or underscores, e.g. ARB-3.' });

export const stackLayerSchema = z.strictObject({
  materialId: z.uuid({ error: 'Choose a material.' }),
  thicknessMm: z
    .number({ error: 'Enter the thickness in mm.' })
    .positive({ error: 'A thickness must be above 0 mm.' })
    .max(1000, { error: 'A thickness above 1000 mm is not a sheet.' }),
});

const layers = z.array(stackLayerSchema).min(1, { error: 'A sample needs at least one layer.' }).max(64);
const route = z.array(processStepSchema).max(200);

export const createSampleBody = z.strictObject({
  code,
  name: z.string().trim().min(1, { error: 'Enter a name.' }).max(120),
  description: z.string().trim().max(4000).default(''),
  layers,
  route: route.default([]),
});
export type CreateSampleBody = z.infer<typeof createSampleBody>;

/** The route is replaced as a whole; steps keep their ids so specimens stay attached. */
export const updateSampleBody = createSampleBody.partial();
export type UpdateSampleBody = z.infer<typeof updateSampleBody>;

export const sampleParams = z.strictObject({
  projectId: z.uuid({ error: 'Not a valid project id.' }),
  sampleId: z.uuid({ error: 'Not a valid sample id.' }),
});
