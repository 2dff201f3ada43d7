import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { FormArray, ReactiveFormsModule } from '@angular/forms';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MatError, MatFormField, MatLabel, MatSuffix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatOption, MatSelect } from '@angular/material/select';
import { STEP_LABELS, STEP_TYPES } from '../../../shared/archive/process-route';
import { ValidationMessagePipe } from '../core/validation-message-pipe';
import { formRevision, moveControl, stepGroup, type StepGroup } from './sample-form';
import { emptyStep, paramFieldsFor } from './sample-form-model';

/** The process route: steps in order, each with the fields its type needs. */
@Component({
  selector: 'ef-route-editor',
  imports: [MatButton, MatError, MatFormField, MatIcon, MatIconButton, MatInput, MatLabel, MatOption, MatSelect, MatSuffix, ReactiveFormsModule, ValidationMessagePipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './route-editor.html',
  styleUrl: './sample-editor-rows.scss',
})
export class RouteEditor {
  readonly steps = input.required<FormArray<StepGroup>>();
  /** Codes of specimens cut after each saved step, by step id: removing such a step is refused. */
  readonly specimensByStep = input<ReadonlyMap<string, readonly string[]>>(new Map());

  protected readonly types = STEP_TYPES.map((value) => ({ value, label: STEP_LABELS[value] }));
  private readonly revision = formRevision(this.steps);
  protected readonly rows = computed(() => {
    this.revision();
    const controls = this.steps().controls;
    return controls.map((group, index) => {
      const fields = new Set(paramFieldsFor(group.controls.type.value));
      const id = group.controls.id.value;
      return {
        group,
        index,
        number: index + 1,
        isFirst: index === 0,
        isLast: index === controls.length - 1,
        show: {
          reductionPct: fields.has('reductionPct'),
          pieces: fields.has('pieces'),
          temperatureC: fields.has('temperatureC'),
          timeMin: fields.has('timeMin'),
          atmosphere: fields.has('atmosphere'),
          details: fields.has('details'),
        },
        specimens: id ? (this.specimensByStep().get(id) ?? []) : [],
      };
    });
  });

  protected addStep(): void {
    const last = this.steps().controls.at(-1)?.getRawValue();
    // Dates usually run on from the step before.
    this.steps().push(stepGroup({ ...emptyStep(), date: last?.date ?? '' }));
  }

  protected move(index: number, by: 1 | -1): void {
    moveControl(this.steps(), index, index + by);
  }

  protected remove(index: number): void {
    this.steps().removeAt(index);
  }
}
