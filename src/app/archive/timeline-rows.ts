import { STEP_LABELS, type ProcessStep, type RouteState } from '../../../shared/archive/process-route';
import { formatPercent, formatStepParams, formatStrain, formatThickness } from './quantities';

/** What the route implies at one point, as text ready to show. */
export interface ImpliedText {
  layerCount: number;
  /** "KV-T22 0.375 mm" per original layer, bottom to top. */
  layerThicknesses: { designation: string; text: string }[];
  totalThickness: string;
  totalReduction: string;
  strain: string;
}

/** One row of the route timeline: the initial stack (index 0) or a step (index i + 1 for route[i]). */
export interface TimelineRow {
  index: number;
  /** 1-based step number; null for the initial stack. */
  stepNumber: number | null;
  /** The step's id, or null for the initial stack and for steps not saved yet. */
  stepId: string | null;
  typeLabel: string;
  date: string | null;
  params: string[];
  notes: string;
  implied: ImpliedText;
  /** Whether this row changed the geometry or strain, so the view can mark it. */
  changesLayers: boolean;
  changesThickness: boolean;
}

type StepLike = Pick<ProcessStep, 'type' | 'params'> & Partial<Pick<ProcessStep, 'id' | 'date' | 'notes'>>;

/** States as text; `designations` name the original layers bottom to top. */
export function impliedText(designations: readonly string[], state: RouteState): ImpliedText {
  return {
    layerCount: state.layerCount,
    layerThicknesses: state.originalLayerThicknessMm.map((mm, i) => ({ designation: designations[i] ?? `layer ${i + 1}`, text: formatThickness(mm) })),
    totalThickness: formatThickness(state.totalThicknessMm),
    totalReduction: formatPercent(state.totalReduction),
    strain: formatStrain(state.vonMisesStrain),
  };
}

/**
 * The timeline of a route: one row for the stack as recorded, then one per
 * step with what the route implies after it. `states` comes from `routeStates()`
 * (states[0] initial, states[i + 1] after route[i]); rows without a state are left out.
 */
export function timelineRows(designations: readonly string[], route: readonly StepLike[], states: readonly RouteState[]): TimelineRow[] {
  const rows: TimelineRow[] = [];
  const initial = states[0];
  if (!initial) return rows;
  rows.push({
    index: 0,
    stepNumber: null,
    stepId: null,
    typeLabel: 'As stacked',
    date: null,
    params: [],
    notes: '',
    implied: impliedText(designations, initial),
    changesLayers: false,
    changesThickness: false,
  });
  route.forEach((step, i) => {
    const state = states[i + 1];
    const before = states[i];
    if (!state || !before) return;
    rows.push({
      index: i + 1,
      stepNumber: i + 1,
      stepId: step.id ?? null,
      typeLabel: STEP_LABELS[step.type],
      date: step.date ?? null,
      params: formatStepParams(step.type, step.params),
      notes: step.notes ?? '',
      implied: impliedText(designations, state),
      changesLayers: state.layerCount !== before.layerCount,
      changesThickness: state.totalReduction !== before.totalReduction,
    });
  });
  return rows;
}

/** "after step 3: Anneal", as the server labels specimens; the initial stack has its own words. */
export function afterStepLabel(route: readonly Pick<ProcessStep, 'id' | 'type'>[], stepId: string | null): string {
  if (stepId === null) return 'as stacked, before any step';
  const index = route.findIndex((s) => s.id === stepId);
  return index < 0 ? 'after a step no longer in the route' : `after step ${index + 1}: ${STEP_LABELS[route[index]!.type]}`;
}
