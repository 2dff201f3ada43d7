import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButton } from '@angular/material/button';
import type { Measurement } from '../../../shared/measurements/measurement-records';
import { resultGist } from './result-rows';

const KIND_NAMES: Record<Measurement['kind'], string> = { intercept: 'Grain size (intercepts)', point_count: 'Point count', thickness: 'Layer thickness' };

/** The image's saved measurements: reopen, recompute when stale, delete. */
@Component({
  selector: 'ef-saved-measurements',
  imports: [DatePipe, MatButton],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="card" aria-labelledby="saved-heading">
      <h2 id="saved-heading">Saved measurements on this image</h2>
      @if (error(); as e) {
        <p role="alert">{{ e }}</p>
      } @else if (list().length === 0) {
        <p class="empty">{{ loading() ? 'Loading…' : 'Nothing measured on this image yet.' }}</p>
      } @else {
        <ul>
          @for (m of list(); track m.id) {
            <li [class.open]="m.id === openId()">
              <div class="what">
                <span><strong>{{ kindName(m) }}</strong> · {{ m.whereLabel }} · <span class="ef-number">{{ gist(m) }}</span></span>
                <span class="who">{{ m.authorName }}, {{ m.updatedAt | date: 'medium' }}, version {{ m.version }}</span>
                @if (m.stale; as stale) {
                  <span class="stale" role="alert">{{ stale.message }}</span>
                }
              </div>
              <div class="buttons">
                <button mat-button type="button" (click)="reopen.emit(m)">Reopen</button>
                @if (m.stale && canMeasure()) {
                  <button mat-stroked-button type="button" (click)="recompute.emit(m)">Recompute</button>
                }
                @if (canMeasure()) {
                  <button mat-button type="button" [attr.aria-label]="'Delete measurement on ' + m.whereLabel + ', version ' + m.version" (click)="remove.emit(m)">Delete</button>
                }
              </div>
            </li>
          }
        </ul>
      }
    </section>
  `,
  styles: `
    .card { border: 1px solid var(--mat-sys-outline-variant); border-radius: 12px; padding: 16px; }
    h2 { margin: 0 0 8px; font: var(--mat-sys-title-medium); }
    ul { list-style: none; margin: 0; padding: 0; display: flex; flex-direction: column; gap: 8px; }
    li { display: flex; justify-content: space-between; gap: 12px; flex-wrap: wrap; padding: 8px; border-radius: 8px; }
    li.open { background: var(--mat-sys-secondary-container); }
    .what { display: flex; flex-direction: column; gap: 2px; }
    .who { color: var(--mat-sys-on-surface-variant); font: var(--mat-sys-body-small); }
    .stale { color: var(--mat-sys-error); }
    .empty { color: var(--mat-sys-on-surface-variant); }
  `,
})
export class SavedMeasurements {
  readonly list = input.required<Measurement[]>();
  readonly loading = input(false);
  readonly error = input<string | null>(null);
  readonly canMeasure = input(false);
  readonly openId = input<string | null>(null);
  readonly reopen = output<Measurement>();
  readonly recompute = output<Measurement>();
  readonly remove = output<Measurement>();

  protected kindName(m: Measurement): string {
    return KIND_NAMES[m.kind];
  }

  protected gist(m: Measurement): string {
    return resultGist(m.result);
  }
}
