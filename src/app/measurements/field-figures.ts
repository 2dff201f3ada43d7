import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { ImageApi } from '../archive/image-api';
import { fieldFigures, type FieldImage } from './field-figure';
import { PatternMarks } from './pattern-marks';

/**
 * The specimen's measured fields as small printable figures: each micrograph's preview with the test
 * lines as counted and the confirmed marks, a scale bar, a caption, and a link back to the measuring page.
 */
@Component({
  selector: 'ef-field-figures',
  imports: [MatButton, MatIcon, MatProgressBar, PatternMarks, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="card" aria-labelledby="fields-heading">
      <h2 id="fields-heading">Fields</h2>
      @if (error(); as e) {
        <div class="state" role="alert">
          <p><mat-icon aria-hidden="true">error_outline</mat-icon> The fields could not be loaded: {{ e }}</p>
          <button mat-stroked-button type="button" (click)="retry.emit()">Try again</button>
        </div>
      } @else if (fields() === undefined) {
        <p class="small" role="status">Loading the fields…</p>
        @if (loading()) {
          <mat-progress-bar mode="indeterminate" aria-label="Loading the fields" />
        }
      } @else if (figures().length === 0) {
        <p class="small">No grain size field is saved on this specimen's images yet.</p>
      } @else {
        <p class="small">Each field as it was counted: the test lines inside its region or band, the confirmed marks, and a scale bar at the pixel size the field was measured with.</p>
        <div class="grid">
          @for (f of figures(); track f.measurementId) {
            <figure>
              <div class="stage" [class.missing]="failed().has(f.imageId)">
                @if (failed().has(f.imageId)) {
                  <p class="no-preview">No preview of this image is available (still processing, or it failed); the pattern is drawn on a blank field.</p>
                }
                <img [src]="previewUrl(f.imageId)" [alt]="'Micrograph of ' + f.title" (error)="previewFailed(f.imageId)" [style.aspect-ratio]="f.width + ' / ' + f.height" />
                <svg role="img" [attr.aria-label]="f.title + ': test lines and marks'" [attr.viewBox]="f.viewBox" preserveAspectRatio="none">
                  <g ef-pattern-marks [paths]="f.paths" [marks]="f.marks" [radius]="f.markRadius"></g>
                  @if (f.scaleBar; as b) {
                    <g class="scale-bar">
                      <rect class="plate" [attr.x]="b.plate.x" [attr.y]="b.plate.y" [attr.width]="b.plate.width" [attr.height]="b.plate.height" [attr.rx]="b.thicknessPx" />
                      <text [attr.x]="b.textX" [attr.y]="b.textY" [attr.font-size]="b.fontPx">{{ b.label }}</text>
                      <rect class="bar" [attr.x]="b.x" [attr.y]="b.y" [attr.width]="b.lengthPx" [attr.height]="b.thicknessPx" />
                    </g>
                  }
                </svg>
              </div>
              <figcaption>
                <strong>{{ f.title }}</strong>
                @for (line of f.caption; track $index) {
                  <span class="line">{{ line }}</span>
                }
                @if (f.stale; as stale) {
                  <span class="stale"><mat-icon aria-hidden="true">history</mat-icon>Stale: {{ stale }}</span>
                }
                <a class="reopen" [routerLink]="['/projects', projectId(), 'images', f.imageId, 'measure']" [queryParams]="{ measurement: f.measurementId }">Reopen field {{ f.number }} on the measuring page</a>
              </figcaption>
            </figure>
          }
        </div>
      }
    </section>
  `,
  styles: `
    .card { border: 1px solid var(--mat-sys-outline-variant); border-radius: 12px; padding: 16px; }
    h2 { margin: 0 0 8px; font: var(--mat-sys-title-medium); }
    .small { margin: 0 0 8px; color: var(--mat-sys-on-surface-variant); font: var(--mat-sys-body-small); }
    .state { display: flex; flex-direction: column; align-items: flex-start; gap: 8px; }
    .state p { display: flex; align-items: center; gap: 6px; margin: 0; }
    .grid { display: grid; grid-template-columns: repeat(auto-fill, minmax(300px, 1fr)); gap: 16px; }
    figure { margin: 0; display: flex; flex-direction: column; gap: 6px; break-inside: avoid; page-break-inside: avoid; }
    .stage { position: relative; line-height: 0; background: #111; border-radius: 6px; overflow: hidden; }
    .stage img { display: block; width: 100%; height: auto; }
    .stage.missing img { visibility: hidden; }
    .stage svg { position: absolute; inset: 0; width: 100%; height: 100%; }
    .no-preview { position: absolute; inset: auto 8px 8px; margin: 0; line-height: 1.3; color: #eee; font: var(--mat-sys-body-small); }
    .scale-bar .plate { fill: rgb(245 247 250 / 0.85); }
    .scale-bar .bar { fill: #101418; }
    .scale-bar text { fill: #101418; font-family: 'IBM Plex Sans', system-ui, sans-serif; font-weight: 600; }
    figcaption { display: flex; flex-direction: column; gap: 2px; font: var(--mat-sys-body-small); }
    figcaption strong { font: var(--mat-sys-label-large); overflow-wrap: anywhere; }
    .line { font-variant-numeric: tabular-nums; overflow-wrap: anywhere; }
    .stale { display: flex; align-items: center; gap: 4px; color: var(--mat-sys-error); }
    .stale mat-icon { font-size: 16px; width: 16px; height: 16px; }
    .reopen { margin-top: 2px; }

    @media print {
      .card { border: none; padding: 0; }
      .grid { grid-template-columns: repeat(2, minmax(0, 1fr)); gap: 10px; }
      .stage { background: none; print-color-adjust: exact; -webkit-print-color-adjust: exact; }
      .reopen { display: none; }
    }
  `,
})
export class FieldFigures {
  private readonly imageApi = inject(ImageApi);

  readonly projectId = input.required<string>();
  /** The specimen's images with their measurements; undefined until loaded. */
  readonly fields = input<readonly FieldImage[] | undefined>(undefined);
  readonly loading = input(false);
  readonly error = input<string | null>(null);
  readonly retry = output<void>();

  protected readonly figures = computed(() => fieldFigures(this.fields() ?? []));
  /** Images whose preview did not load: the figure says so instead of showing a broken picture. */
  protected readonly failed = signal<ReadonlySet<string>>(new Set());

  protected previewUrl(imageId: string): string {
    return this.imageApi.previewUrl(this.projectId(), imageId);
  }

  protected previewFailed(imageId: string): void {
    this.failed.update((s) => new Set([...s, imageId]));
  }
}
