import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatFormField, MatLabel, MatSuffix } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatOption, MatSelect } from '@angular/material/select';
import { apiErrorMessage } from '../core/api-error-message';
import { remote } from '../core/remote';
import { PresetApi } from './preset-api';

/**
 * Apply a saved instrument set-up's pixel size to the given images (one on the image page,
 * all listed ones on the search page), or save a new set-up. Each change is on record on the server.
 */
@Component({
  selector: 'ef-calibration-presets',
  imports: [MatButton, MatFormField, MatInput, MatLabel, MatOption, MatSelect, MatSuffix, ReactiveFormsModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h3>Calibration presets</h3>
    @if (presets.error(); as error) {
      <p class="problem">{{ error }}</p>
    } @else if (presets.value(); as list) {
      @if (list.length === 0) {
        <p class="hint">No presets yet. Save one for each objective and camera whose pixel size you know.</p>
      } @else {
        <div class="row">
          <mat-form-field subscriptSizing="dynamic">
            <mat-label>Preset</mat-label>
            <mat-select [value]="chosen()" (valueChange)="chosen.set($event)" aria-label="Preset">
              @for (p of list; track p.id) {
                <mat-option [value]="p.id">{{ p.name }} — {{ p.umPerPx }} µm/px</mat-option>
              }
            </mat-select>
          </mat-form-field>
          <button mat-stroked-button type="button" [disabled]="!chosen() || busy() || imageIds().length === 0" (click)="apply()">{{ applyLabel() }}</button>
        </div>
      }
    }
    @if (message()) {
      <p class="hint" role="status">{{ message() }}</p>
    }
    <details>
      <summary>New preset</summary>
      <form [formGroup]="form" (ngSubmit)="save()" class="new">
        <mat-form-field><mat-label>Preset name</mat-label><input matInput formControlName="name" /></mat-form-field>
        <mat-form-field><mat-label>Instrument</mat-label><input matInput formControlName="instrument" /></mat-form-field>
        <mat-form-field><mat-label>Objective</mat-label><input matInput formControlName="objective" placeholder="50x / 0.80" /></mat-form-field>
        <mat-form-field><mat-label>Camera</mat-label><input matInput formControlName="camera" /></mat-form-field>
        <mat-form-field>
          <mat-label>Preset pixel size</mat-label>
          <input matInput type="number" step="any" formControlName="umPerPx" />
          <span matTextSuffix>µm/px</span>
        </mat-form-field>
        <button mat-stroked-button type="submit" [disabled]="busy()">Save preset</button>
      </form>
    </details>
  `,
  styles: `
    :host { display: block; }
    h3 { margin: 0 0 8px; font: var(--mat-sys-title-small); }
    .row { display: flex; gap: 8px; align-items: center; flex-wrap: wrap; }
    .row mat-form-field { flex: 1 1 200px; }
    .new { display: grid; gap: 4px; padding-top: 8px; }
    .hint { color: var(--mat-sys-on-surface-variant); font: var(--mat-sys-body-small); }
    .problem { color: var(--mat-sys-error); }
  `,
})
export class CalibrationPresets {
  private readonly api = inject(PresetApi);

  readonly projectId = input.required<string>();
  readonly imageIds = input.required<string[]>();
  readonly applied = output<number>();

  protected readonly presets = remote(() => this.projectId(), (id) => this.api.list(id));
  protected readonly chosen = signal<string | null>(null);
  protected readonly busy = signal(false);
  protected readonly message = signal('');
  protected readonly applyLabel = computed(() => (this.imageIds().length === 1 ? 'Apply to this image' : `Apply to the ${this.imageIds().length} images listed`));
  protected readonly form = new FormGroup({
    name: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    instrument: new FormControl('', { nonNullable: true }),
    objective: new FormControl('', { nonNullable: true }),
    camera: new FormControl('', { nonNullable: true }),
    umPerPx: new FormControl<number | null>(null, [Validators.required, Validators.min(0.0001), Validators.max(1000)]),
  });

  protected apply(): void {
    const presetId = this.chosen();
    if (!presetId || this.busy()) return;
    this.busy.set(true);
    this.api.apply(this.projectId(), presetId, this.imageIds()).subscribe({
      next: ({ updated }) => {
        this.busy.set(false);
        this.message.set(`Pixel size set on ${updated} image${updated === 1 ? '' : 's'}; each change is in its calibration history.`);
        this.applied.emit(updated);
      },
      error: (error) => {
        this.busy.set(false);
        this.message.set(apiErrorMessage(error).message);
      },
    });
  }

  protected save(): void {
    this.form.markAllAsTouched();
    const v = this.form.getRawValue();
    if (this.form.invalid || v.umPerPx === null) {
      this.message.set('Give the preset a name and a pixel size between 0.0001 and 1000 µm/px.');
      return;
    }
    this.busy.set(true);
    this.api.create(this.projectId(), { ...v, umPerPx: v.umPerPx }).subscribe({
      next: (preset) => {
        this.busy.set(false);
        this.form.reset();
        this.chosen.set(preset.id);
        this.message.set(`Preset “${preset.name}” saved.`);
        this.presets.reload();
      },
      error: (error) => {
        this.busy.set(false);
        this.message.set(apiErrorMessage(error).message);
      },
    });
  }
}
