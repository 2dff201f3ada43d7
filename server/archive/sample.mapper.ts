import { routeStates, STEP_LABELS, type ProcessStep } from '../../shared/archive/process-route';
import type { SampleDetail, SampleSummary } from '../../shared/archive/samples';
import type { RouteStep } from './route-step.entity';
import type { SampleLayer } from './sample-layer.entity';
import type { Sample } from './sample.entity';

export function toProcessStep(s: RouteStep): ProcessStep {
  return { id: s.id, type: s.type, date: s.date, params: s.params, notes: s.notes };
}

/** "after step 3: Anneal", or the initial stack when no step is given. */
export function stepLabel(step: Pick<RouteStep, 'position' | 'type'> | null): string {
  return step ? `after step ${step.position + 1}: ${STEP_LABELS[step.type]}` : 'as stacked, before any step';
}

export function toSampleSummary(s: Sample, stack: string[], stepCount: number, specimenCount: number): SampleSummary {
  return { id: s.id, projectId: s.projectId, code: s.code, name: s.name, stack, stepCount, specimenCount, updatedAt: s.updatedAt.toISOString() };
}

export function toSampleDetail(s: Sample, layers: SampleLayer[], steps: RouteStep[], specimenCount: number): SampleDetail {
  const route = steps.map(toProcessStep);
  const stack = layers.map((l) => ({ materialId: l.materialId, thicknessMm: l.thicknessMm, designation: l.material.designation }));
  const { stack: _designations, ...summary } = toSampleSummary(s, stack.map((l) => l.designation), steps.length, specimenCount);
  return { ...summary, description: s.description, layers: stack, route, states: routeStates(stack, route), createdAt: s.createdAt.toISOString() };
}
