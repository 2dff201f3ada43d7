import { z } from 'zod';

/** The kinds of step a sample's process route is made of. */
export const STEP_TYPES = [
  'hot_rolling',
  'cold_rolling',
  'surface_preparation',
  'roll_bonding',
  'cut_and_stack',
  'anneal',
  'tensile_test',
  'other',
] as const;
export type StepType = (typeof STEP_TYPES)[number];

export const STEP_LABELS: Record<StepType, string> = {
  hot_rolling: 'Hot rolling',
  cold_rolling: 'Cold rolling',
  surface_preparation: 'Surface preparation',
  roll_bonding: 'Roll-bonding pass',
  cut_and_stack: 'Cut and stack',
  anneal: 'Anneal',
  tensile_test: 'Tensile test',
  other: 'Other',
};

/** Steps that thin the whole stack by a thickness reduction. */
const REDUCING: ReadonlySet<StepType> = new Set(['hot_rolling', 'cold_rolling', 'roll_bonding']);

/** Step parameters; which ones apply depends on the type (checked by `processStepSchema`). */
export interface StepParams {
  /** Thickness reduction of the pass, % (rolling and roll bonding). */
  reductionPct?: number;
  /** Number of pieces stacked (cut and stack). */
  pieces?: number;
  /** Anneal temperature °C, time min and atmosphere. */
  temperatureC?: number;
  timeMin?: number;
  atmosphere?: string;
  /** Free text for the rest (brushing depth, strain rate…). */
  details?: string;
}

export interface ProcessStep {
  id: string;
  type: StepType;
  /** ISO date (yyyy-mm-dd) or null when not recorded. */
  date: string | null;
  params: StepParams;
  notes: string;
}

/** One layer of the initial stack, bottom to top. */
export interface StackLayer {
  materialId: string;
  thicknessMm: number;
}

/** What the route implies after a step (or for the initial stack). */
export interface RouteState {
  layerCount: number;
  /** Nominal thickness of each original layer, in stack order, mm. */
  originalLayerThicknessMm: number[];
  /** Total thickness of the sheet, mm. */
  totalThicknessMm: number;
  /** 1 − (current thickness of an original layer / its initial thickness). */
  totalReduction: number;
  /** Accumulated von Mises equivalent strain of plane-strain rolling. */
  vonMisesStrain: number;
}

/**
 * Von Mises equivalent strain of one plane-strain rolling pass with thickness reduction r:
 * ε = (2/√3)·ln(1/(1 − r)) (Saito et al., Acta Mater. 47 (1999) 579).
 */
export function vonMisesStrainOfPass(reduction: number): number {
  if (!(reduction >= 0 && reduction < 1)) throw new RangeError(`A reduction must be in [0, 1); got ${reduction}.`);
  return (2 / Math.sqrt(3)) * Math.log(1 / (1 - reduction));
}

/**
 * Walks the route from the recorded stack: reducing steps thin every layer, cut-and-stack
 * multiplies the layer count; other steps leave the geometry as it was.
 * Returns the initial state followed by one state per step.
 */
export function routeStates(stack: readonly StackLayer[], steps: readonly Pick<ProcessStep, 'type' | 'params'>[]): RouteState[] {
  const initial = stack.map((l) => l.thicknessMm);
  let copies = 1;
  let factor = 1;
  let strain = 0;
  const state = (): RouteState => {
    const layers = initial.map((t) => t * factor);
    return {
      layerCount: stack.length * copies,
      originalLayerThicknessMm: layers,
      totalThicknessMm: layers.reduce((a, b) => a + b, 0) * copies,
      totalReduction: 1 - factor,
      vonMisesStrain: strain,
    };
  };
  const states = [state()];
  for (const step of steps) {
    if (REDUCING.has(step.type) && step.params.reductionPct !== undefined) {
      const r = step.params.reductionPct / 100;
      factor *= 1 - r;
      strain += vonMisesStrainOfPass(r);
    } else if (step.type === 'cut_and_stack') {
      copies *= step.params.pieces ?? 2;
    }
    states.push(state());
  }
  return states;
}

const isoDate = z.iso.date({ error: 'Use a date like 2026-03-14.' });
const reductionPct = z
  .number({ error: 'Enter the thickness reduction in %.' })
  .gt(0, { error: 'A reduction must be above 0 %.' })
  .lt(100, { error: 'A reduction must be below 100 %.' });

/** One step as sent by the client; `id` is kept for existing steps so specimens stay attached. */
export const processStepSchema = z
  .strictObject({
    id: z.uuid().optional(),
    type: z.enum(STEP_TYPES),
    date: isoDate.nullable().default(null),
    params: z
      .strictObject({
        reductionPct: reductionPct.optional(),
        pieces: z.number().int({ error: 'Pieces must be a whole number.' }).min(2, { error: 'Stack at least 2 pieces.' }).max(64).optional(),
        temperatureC: z.number().min(-273.15, { error: 'Below absolute zero.' }).max(3000).optional(),
        timeMin: z.number().positive({ error: 'A time must be above 0 min.' }).max(1e6).optional(),
        atmosphere: z.string().trim().max(100).optional(),
        details: z.string().trim().max(1000).optional(),
      })
      .default({}),
    notes: z.string().trim().max(2000).default(''),
  })
  .superRefine((step, ctx) => {
    const need = (field: keyof StepParams, message: string) => {
      if (step.params[field] === undefined) ctx.addIssue({ code: 'custom', path: ['params', field], message });
    };
    if (REDUCING.has(step.type)) need('reductionPct', 'A rolling pass needs its thickness reduction in %.');
    if (step.type === 'anneal') {
      need('temperatureC', 'An anneal needs its temperature in °C.');
      need('timeMin', 'An anneal needs its time in min.');
    }
  });
export type ProcessStepInput = z.input<typeof processStepSchema>;
