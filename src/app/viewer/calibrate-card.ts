import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatCheckbox } from '@angular/material/checkbox';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { MatOption, MatSelect } from '@angular/material/select';
import type { Coordinates } from '../../../shared/annotations/annotations';
import type { ImageRecord } from '../../../shared/images';
import { distance } from '../../../shared/annotations/geometry';
import { apiErrorMessage } from '../core/api-error-message';
import { failureOf } from './annotation-store';
import { formatPixelSize, LENGTH_UNITS, previewCalibration, type LengthUnit } from './calibration-input';
import { formatPixels } from './measurements';
import { ViewerApi } from './viewer-api';

/**
 * The calibrate tool's form: the drawn line's true length with its unit, the resulting pixel
 * size before saving, and the plausibility warning with a way to keep the value anyway.
 */
@Component({
  selector: 'ef-calibrate-card',
  imports: [MatButton, MatCheckbox, MatFormField, MatInput, MatLabel, MatOption, MatSelect],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="card" aria-labelledby="calibrate-heading">
      <h2 id="calibrate-heading">Calibrate from the drawn line</h2>
      <p class="line">The line is {{ linePx() }} long. Enter the true length of the scale it follows.</p>
      <form class="fields" (submit)="$event.preventDefault(); save()">
        <mat-form-field class="length">
          <mat-label>True length</mat-label>
          <input matInput type="number" name="length" min="0" step="any" required aria-label="True length" [value]="value() ?? ''" (input)="setValue($any($event.target).value)" />
        </mat-form-field>
        <mat-form-field class="unit">
          <mat-label>Unit</mat-label>
          <mat-select name="unit" aria-label="Unit" [value]="unit()" (valueChange)="unit.set($event)">
            @for (u of units; track u) {
              <mat-option [value]="u">{{ u }}</mat-option>
            }
          </mat-select>
        </mat-form-field>
      </form>
      @if (preview(); as p) {
        @if (p.ok) {
          <p class="result" aria-live="polite">Pixel size: <strong>{{ format(p.umPerPx) }}</strong></p>
          @if (p.warning) {
            <p class="warning" role="alert">{{ p.warning }}</p>
            <mat-checkbox [checked]="keep()" (change)="keep.set($event.checked)">Keep this value</mat-checkbox>
          }
        } @else {
          <p class="hint">{{ p.problem }}</p>
        }
      }
      @if (serverWarning()) {
        <p class="warning" role="alert">{{ serverWarning() }}</p>
        <mat-checkbox [checked]="keep()" (change)="keep.set($event.checked)">Keep this value</mat-checkbox>
      }
      @if (error()) {
        <p class="error" role="alert">{{ error() }}</p>
      }
      <div class="actions">
        <button mat-button type="button" (click)="cancelled.emit()">Cancel</button>
        <button mat-flat-button type="button" [disabled]="!canSave()" (click)="save()">Save pixel size</button>
      </div>
    </section>
  `,
  styles: `
    .card {
      display: flex;
      flex-direction: column;
      gap: 8px;
      width: 320px;
      padding: 16px;
      border-radius: var(--mat-sys-corner-medium);
      background: var(--mat-sys-surface-container-high);
      color: var(--mat-sys-on-surface);
      box-shadow: var(--mat-sys-level3);
    }
    h2 {
      margin: 0;
      font: var(--mat-sys-title-small);
    }
    p {
      margin: 0;
      font: var(--mat-sys-body-small);
    }
    .fields {
      display: flex;
      gap: 8px;
    }
    .length {
      flex: 1 1 auto;
    }
    .unit {
      width: 96px;
    }
    .result strong {
      font-family: var(--ef-mono);
    }
    .warning {
      padding: 6px 8px;
      border-radius: var(--mat-sys-corner-small);
      background: var(--mat-sys-tertiary-container);
      color: var(--mat-sys-on-tertiary-container);
    }
    .error {
      color: var(--mat-sys-error);
    }
    .hint {
      color: var(--mat-sys-on-surface-variant);
    }
    .actions {
      display: flex;
      justify-content: flex-end;
      gap: 8px;
    }
  `,
})
export class CalibrateCard {
  private readonly api = inject(ViewerApi);

  readonly projectId = input.required<string>();
  readonly image = input.required<ImageRecord>();
  /** Start and end of the drawn line, image pixels. */
  readonly line = input.required<Coordinates>();
  readonly saved = output<ImageRecord>();
  readonly cancelled = output<void>();

  protected readonly units = Object.keys(LENGTH_UNITS) as LengthUnit[];
  protected readonly value = signal<number | null>(null);
  protected readonly unit = signal<LengthUnit>('µm');
  protected readonly keep = signal(false);
  protected readonly busy = signal(false);
  protected readonly error = signal('');
  /** The server's plausibility warning, when it refused without "keep". */
  protected readonly serverWarning = signal('');
  protected readonly linePx = computed(() => formatPixels(distance(this.line()[0]!, this.line()[1]!)));
  protected readonly preview = computed(() => previewCalibration(this.line()[0]!, this.line()[1]!, this.value(), this.unit()));
  protected readonly canSave = computed(() => {
    const p = this.preview();
    return !this.busy() && p.ok && (!p.warning || this.keep());
  });
  protected readonly format = formatPixelSize;

  protected setValue(text: string): void {
    const n = text.trim() === '' ? null : Number(text);
    this.value.set(n !== null && Number.isFinite(n) ? n : null);
    this.serverWarning.set('');
  }

  protected save(): void {
    const p = this.preview();
    if (!p.ok || !this.canSave()) return;
    const [start, end] = this.line() as [[number, number], [number, number]];
    this.busy.set(true);
    this.error.set('');
    this.api.calibrateByLine(this.projectId(), this.image().id, { start, end, trueLengthUm: p.trueLengthUm, acceptImplausible: this.keep() }).subscribe({
      next: (record) => {
        this.busy.set(false);
        this.saved.emit(record);
      },
      error: (err: unknown) => {
        this.busy.set(false);
        const f = failureOf(err);
        // A 422 on the true length is the plausibility warning: offer to keep the value, as for the local one.
        const onLength = err instanceof HttpErrorResponse ? apiErrorMessage(err).fieldErrors['trueLengthUm'] : undefined;
        if (f.status === 422 && onLength) this.serverWarning.set(onLength);
        else this.error.set(f.message);
      },
    });
  }
}
