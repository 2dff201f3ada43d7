import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { FormArray, ReactiveFormsModule } from '@angular/forms';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MatError, MatFormField, MatLabel, MatSuffix } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatOption, MatSelect } from '@angular/material/select';
import type { Material } from '../../../shared/archive/materials';
import { ValidationMessagePipe } from '../core/validation-message-pipe';
import { formRevision, layerGroup, moveControl, type LayerGroup } from './sample-form';

/** The initial stack: rows of material and thickness, shown top layer first, as the stack stands. */
@Component({
  selector: 'ef-layers-editor',
  imports: [MatButton, MatError, MatFormField, MatIcon, MatIconButton, MatInput, MatLabel, MatOption, MatSelect, MatSuffix, ReactiveFormsModule, ValidationMessagePipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <p class="hint">Listed as the stack stands: the top layer first, layer 1 at the bottom.</p>
    <ol class="rows" aria-label="Layers, top to bottom">
      @for (row of rows(); track row.group) {
        <li class="row" [formGroup]="row.group">
          <span class="number ef-number" aria-hidden="true">{{ row.number }}</span>
          <mat-form-field class="material">
            <mat-label>Material</mat-label>
            <mat-select formControlName="materialId" [aria-label]="'Layer ' + row.number + ' material'">
              @for (m of materials(); track m.id) {
                <mat-option [value]="m.id">{{ m.designation }}</mat-option>
              }
            </mat-select>
            <mat-error>{{ row.group.controls.materialId.errors | validationMessage }}</mat-error>
          </mat-form-field>
          <mat-form-field class="thickness">
            <mat-label>Thickness</mat-label>
            <input matInput type="number" formControlName="thicknessMm" min="0" step="any" [attr.aria-label]="'Layer ' + row.number + ' thickness in mm'" />
            <span matTextSuffix>mm</span>
            <mat-error>{{ row.group.controls.thicknessMm.errors | validationMessage }}</mat-error>
          </mat-form-field>
          <div class="row-buttons">
            <button mat-icon-button type="button" [disabled]="row.isTop" [attr.aria-label]="'Move layer ' + row.number + ' up'" (click)="move(row.index, 1)">
              <mat-icon>arrow_upward</mat-icon>
            </button>
            <button mat-icon-button type="button" [disabled]="row.isBottom" [attr.aria-label]="'Move layer ' + row.number + ' down'" (click)="move(row.index, -1)">
              <mat-icon>arrow_downward</mat-icon>
            </button>
            <button mat-icon-button type="button" [disabled]="onlyOne()" [attr.aria-label]="'Remove layer ' + row.number" (click)="remove(row.index)">
              <mat-icon>delete</mat-icon>
            </button>
          </div>
        </li>
      }
    </ol>
    <button mat-stroked-button type="button" class="add" (click)="addOnTop()">
      <mat-icon>add</mat-icon>
      Add layer on top
    </button>
  `,
  styleUrl: './sample-editor-rows.scss',
})
export class LayersEditor {
  readonly layers = input.required<FormArray<LayerGroup>>();
  readonly materials = input.required<readonly Material[]>();

  private readonly revision = formRevision(this.layers);
  /** Top layer first; `index` is the position in the stack (0 = bottom), `number` its 1-based name. */
  protected readonly rows = computed(() => {
    this.revision();
    const controls = this.layers().controls;
    return controls
      .map((group, index) => ({ group, index, number: index + 1, isTop: index === controls.length - 1, isBottom: index === 0 }))
      .reverse();
  });
  protected readonly onlyOne = computed(() => this.rows().length <= 1);

  protected addOnTop(): void {
    const last = this.layers().controls.at(-1)?.getRawValue();
    // A laminate alternates: offer the other material of the last two, or repeat the last.
    const previous = this.layers().controls.at(-2)?.getRawValue();
    this.layers().push(layerGroup({ materialId: previous?.materialId ?? '', thicknessMm: last?.thicknessMm ?? null }));
  }

  protected move(index: number, by: 1 | -1): void {
    moveControl(this.layers(), index, index + by);
  }

  protected remove(index: number): void {
    this.layers().removeAt(index);
  }
}
