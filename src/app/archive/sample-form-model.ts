import type { ProcessStep, RouteState, StackLayer, StepParams, StepType } from '../../../shared/archive/process-route';
import { routeStates } from '../../../shared/archive/process-route';

/**
 * The sample form as plain values, and the conversions between it, the
 * server's sample and the request body. Pure, so mocha can check them.
 */

export interface LayerFormValue {
  materialId: string;
  thicknessMm: number | null;
}

/** One step row of the route editor; every parameter has a field, the type decides which are shown and sent. */
export interface StepFormValue {
  /** Kept for saved steps, so specimens cut after them stay attached. */
  id: string | null;
  type: StepType;
  /** yyyy-mm-dd or ''. */
  date: string;
  reductionPct: number | null;
  pieces: number | null;
  temperatureC: number | null;
  timeMin: number | null;
  atmosphere: string;
  details: string;
  notes: string;
}

export type ParamField = keyof StepParams;

const FIELDS_BY_TYPE: Record<StepType, readonly ParamField[]> = {
  hot_rolling: ['reductionPct', 'details'],
  cold_rolling: ['reductionPct', 'details'],
  roll_bonding: ['reductionPct', 'details'],
  cut_and_stack: ['pieces', 'details'],
  anneal: ['temperatureC', 'timeMin', 'atmosphere'],
  surface_preparation: ['details'],
  tensile_test: ['details'],
  other: ['details'],
};

/** Parameters that must be filled in for a type, as the server requires. */
const REQUIRED_BY_TYPE: Partial<Record<StepType, readonly ParamField[]>> = {
  hot_rolling: ['reductionPct'],
  cold_rolling: ['reductionPct'],
  roll_bonding: ['reductionPct'],
  anneal: ['temperatureC', 'timeMin'],
};

/** The parameter fields the form shows for a step type, in display order. */
export function paramFieldsFor(type: StepType): readonly ParamField[] {
  return FIELDS_BY_TYPE[type];
}

export function isParamRequired(type: StepType, field: ParamField): boolean {
  return REQUIRED_BY_TYPE[type]?.includes(field) ?? false;
}

export function emptyStep(type: StepType = 'roll_bonding'): StepFormValue {
  return { id: null, type, date: '', reductionPct: null, pieces: type === 'cut_and_stack' ? 2 : null, temperatureC: null, timeMin: null, atmosphere: '', details: '', notes: '' };
}

export function stepFormValue(step: ProcessStep): StepFormValue {
  const p = step.params;
  return {
    id: step.id,
    type: step.type,
    date: step.date ?? '',
    reductionPct: p.reductionPct ?? null,
    pieces: p.pieces ?? null,
    temperatureC: p.temperatureC ?? null,
    timeMin: p.timeMin ?? null,
    atmosphere: p.atmosphere ?? '',
    details: p.details ?? '',
    notes: step.notes,
  };
}

/** Only the parameters that belong to the type, and only those filled in. */
export function stepParams(value: StepFormValue): StepParams {
  const params: StepParams = {};
  for (const field of paramFieldsFor(value.type)) {
    const raw = value[field];
    if (typeof raw === 'number' && Number.isFinite(raw)) (params as Record<string, number>)[field] = raw;
    else if (typeof raw === 'string' && raw.trim() !== '') (params as Record<string, string>)[field] = raw.trim();
  }
  return params;
}

/** A step as the PATCH/POST body carries it; saved steps keep their id. */
export interface StepBody {
  id?: string;
  type: StepType;
  date: string | null;
  params: StepParams;
  notes: string;
}

export function stepBody(value: StepFormValue): StepBody {
  return {
    ...(value.id ? { id: value.id } : {}),
    type: value.type,
    date: value.date ? value.date : null,
    params: stepParams(value),
    notes: value.notes.trim(),
  };
}

export function layerBody(value: LayerFormValue): StackLayer {
  return { materialId: value.materialId, thicknessMm: value.thicknessMm ?? 0 };
}

/**
 * What the unsaved form implies, for the live preview: layers without a
 * material or a usable thickness are left out, and a pass whose reduction is
 * not yet in (0, 100) % counts as no reduction, so half-typed values never throw.
 */
export function previewStates(layers: readonly LayerFormValue[], steps: readonly StepFormValue[]): RouteState[] {
  const stack = layers.filter((l) => l.materialId && l.thicknessMm !== null && l.thicknessMm > 0).map(layerBody);
  const route = steps.map((s) => {
    const params = stepParams(s);
    if (params.reductionPct !== undefined && !(params.reductionPct > 0 && params.reductionPct < 100)) delete params.reductionPct;
    if (params.pieces !== undefined && !(Number.isInteger(params.pieces) && params.pieces >= 2)) delete params.pieces;
    return { type: s.type, params };
  });
  return routeStates(stack, route);
}
