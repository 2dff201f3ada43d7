import { ChangeDetectionStrategy, Component, computed, inject, input, model, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatError, MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatOption, MatSelect } from '@angular/material/select';
import { layoutPanels, type FigureSpec } from '../../../shared/figures';
import { apiErrorMessage } from '../core/api-error-message';
import { FigureApi, readBlobError } from './figure-api';
import { pixelSizeText } from './figure-geometry';

/** Export settings, the pixel size they give, and the download of the file the server renders. */
@Component({
  selector: 'ef-export-panel',
  imports: [MatButton, MatError, MatFormField, MatHint, MatIcon, MatInput, MatLabel, MatOption, MatProgressBar, MatSelect],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="export" aria-labelledby="export-heading">
      <h2 id="export-heading">Export</h2>
      <div class="fields">
        <mat-form-field subscriptSizing="dynamic">
          <mat-label>Format</mat-label>
          <mat-select aria-label="Format" [value]="format()" (selectionChange)="format.set($event.value)">
            <mat-option value="png">PNG</mat-option>
            <mat-option value="tiff">TIFF (LZW)</mat-option>
          </mat-select>
        </mat-form-field>
        <mat-form-field subscriptSizing="dynamic">
          <mat-label>Width in mm</mat-label>
          <input matInput type="number" min="20" max="500" step="any" aria-label="Width in mm" [value]="widthMm()" (input)="widthMm.set(+$any($event.target).value)" />
          <mat-hint>20 to 500</mat-hint>
          @if (widthProblem()) {
            <mat-error>{{ widthProblem() }}</mat-error>
          }
        </mat-form-field>
        <mat-form-field subscriptSizing="dynamic">
          <mat-label>Dots per inch</mat-label>
          <input matInput type="number" min="72" max="1200" step="1" aria-label="Dots per inch" [value]="dpi()" (input)="dpi.set(+$any($event.target).value)" />
          <mat-hint>72 to 1200</mat-hint>
          @if (dpiProblem()) {
            <mat-error>{{ dpiProblem() }}</mat-error>
          }
        </mat-form-field>
      </div>
      <p class="note">A journal column is about 85 mm wide, a full page about 170 mm; print usually asks 300 to 600 dpi.</p>
      @if (figureId() !== null) {
        <p class="note">Width and dpi are saved with the figure as its print size; clearing it keeps a PNG and a TIFF at that size.</p>
      }
      @if (localProblem(); as problem) {
        <p class="problem" role="alert">{{ problem }}</p>
      } @else {
        <p class="size" role="status">The file will be <strong class="ef-number">{{ sizeText() }}</strong>.</p>
      }
      @if (unsaved()) {
        <p class="note">Exports use the saved figure. Save first to export the changes shown here.</p>
      }
      <div class="actions">
        <button mat-flat-button type="button" [disabled]="!canExport()" (click)="exportFigure()">
          <mat-icon>download</mat-icon>
          Export
        </button>
      </div>
      @if (busy()) {
        <div class="rendering" role="status">
          <mat-progress-bar mode="indeterminate" aria-label="Rendering the figure" />
          <span>The server is rendering the figure from the original images…</span>
        </div>
      }
      @if (failure(); as message) {
        <p class="problem" role="alert">{{ message }}</p>
      }
      @if (done(); as name) {
        <p class="done" role="status">Downloaded {{ name }}.</p>
      }
    </section>
  `,
  styles: `
    :host {
      display: block;
    }
    .export {
      display: flex;
      flex-direction: column;
      gap: 10px;
      padding: 16px;
      border-radius: var(--mat-sys-corner-medium);
      background: var(--mat-sys-surface-container-low);
      border: 1px solid var(--mat-sys-outline-variant);
    }
    h2 {
      margin: 0;
      font: var(--mat-sys-title-medium);
    }
    .fields {
      display: grid;
      grid-template-columns: repeat(auto-fill, minmax(150px, 1fr));
      align-items: start;
      gap: 12px;
    }
    .size,
    .note,
    .done,
    .problem {
      margin: 0;
    }
    .note {
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
    .problem {
      color: var(--mat-sys-error);
    }
    .rendering {
      display: flex;
      flex-direction: column;
      gap: 6px;
      font: var(--mat-sys-body-small);
    }
  `,
})
export class ExportPanel {
  private readonly api = inject(FigureApi);

  readonly projectId = input.required<string>();
  /** Null until the figure is saved once. */
  readonly figureId = input<string | null>(null);
  readonly spec = input.required<Pick<FigureSpec, 'columns' | 'gapMm' | 'panels'>>();
  readonly unsaved = input(false);
  readonly widthMm = model(170);
  readonly dpi = model(300);
  readonly format = model<'png' | 'tiff'>('png');

  protected readonly busy = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly done = signal<string | null>(null);

  protected readonly widthProblem = computed(() => {
    const w = this.widthMm();
    return !Number.isFinite(w) || w < 20 ? 'At least 20 mm wide.' : w > 500 ? 'At most 500 mm wide.' : null;
  });
  protected readonly dpiProblem = computed(() => {
    const d = this.dpi();
    if (!Number.isInteger(d)) return 'Enter a whole number of dots per inch.';
    return d < 72 ? 'At least 72 dpi.' : d > 1200 ? 'At most 1200 dpi.' : null;
  });
  protected readonly localProblem = computed(() => {
    if (this.spec().panels.length === 0) return 'Add a panel to export.';
    return this.widthProblem() ?? this.dpiProblem();
  });
  protected readonly sizeText = computed(() => {
    const l = layoutPanels(this.spec(), this.widthMm(), this.dpi());
    return pixelSizeText(l.width, l.height);
  });
  protected readonly canExport = computed(() => !this.busy() && this.figureId() !== null && this.localProblem() === null);

  protected exportFigure(): void {
    const figureId = this.figureId();
    if (!figureId) return;
    this.busy.set(true);
    this.failure.set(null);
    this.done.set(null);
    this.api.export(this.projectId(), figureId, { format: this.format(), widthMm: this.widthMm(), dpi: this.dpi() }).subscribe({
      next: ({ blob, fileName }) => {
        this.busy.set(false);
        saveBlob(blob, fileName);
        this.done.set(fileName);
      },
      error: (error: unknown) => {
        void readBlobError(error).then((response) => {
          const failure = apiErrorMessage(response);
          const details = Object.values(failure.fieldErrors).filter((m) => !failure.message.includes(m));
          this.failure.set([failure.message, ...details].join(' '));
          this.busy.set(false);
        });
      },
    });
  }
}

/** Hands the file to the browser's download through a short-lived object URL. */
function saveBlob(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  link.rel = 'noopener';
  document.body.appendChild(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}
