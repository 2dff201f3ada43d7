import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIcon } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import type { Specimen } from '../../../shared/archive/specimens';
import type { TimelineRow } from './timeline-rows';

/** The process route as a vertical timeline, with what it implies beside each step. */
@Component({
  selector: 'ef-route-timeline',
  imports: [DatePipe, MatIcon, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './route-timeline.html',
  styleUrl: './route-timeline.scss',
})
export class RouteTimeline {
  readonly rows = input.required<readonly TimelineRow[]>();
  /** Specimens of the sample, shown at the step they were cut after. */
  readonly specimens = input<readonly Specimen[]>([]);
  readonly projectId = input.required<string>();

  /** Specimen links per row index: 0 for "as stacked", i + 1 after step i. */
  protected readonly specimensByRow = computed(() => {
    const byStep = new Map<string | null, Pick<Specimen, 'id' | 'code'>[]>();
    for (const s of this.specimens()) byStep.set(s.afterStepId, [...(byStep.get(s.afterStepId) ?? []), { id: s.id, code: s.code }]);
    return this.rows().map((row) => (row.index === 0 ? (byStep.get(null) ?? []) : row.stepId ? (byStep.get(row.stepId) ?? []) : []));
  });
}
