import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { DatePipe } from '@angular/common';
import type { Measurement, MeasurementHistoryEntry } from '../../../shared/measurements/measurement-records';
import { formatUmPerPx } from './measure-units';
import { groupRows, historyLine, resultRows } from './result-rows';

/** The server's numbers for one saved measurement, with units and the sentences that belong beside them. */
@Component({
  selector: 'ef-measure-result',
  imports: [DatePipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="card result" aria-labelledby="result-heading">
      <h2 id="result-heading">Saved result · {{ measurement().whereLabel }}</h2>
      @for (group of groups(); track group.title) {
        @if (group.title) {
          <h3>{{ group.title }}</h3>
        }
        <dl>
          @for (row of group.rows; track row.label + (row.sub ?? '')) {
            <div><dt>{{ row.label }}@if (row.sub) {<sub>{{ row.sub }}</sub>}</dt><dd class="ef-number">{{ row.value }}</dd></div>
          }
          @if ($first) {
            <div><dt>Pixel size used</dt><dd class="ef-number">{{ pixel() }}</dd></div>
          }
        </dl>
      }
      @if (measurement().stale; as stale) {
        <p class="stale" role="alert">{{ stale.message }}</p>
      }
      @for (s of measurement().result.statements; track $index) {
        <p class="statement">{{ s }}</p>
      }
      @if (history().length > 0) {
        <section class="history" aria-labelledby="history-heading">
          <h3 id="history-heading">Earlier results of this measurement</h3>
          <ul>
            @for (h of history(); track h.version + h.reason) {
              <li>{{ line(h) }}, {{ h.replacedAt | date: 'medium' }}</li>
            }
          </ul>
        </section>
      }
    </section>
  `,
  styles: `
    .card { border: 1px solid var(--mat-sys-outline-variant); border-radius: 12px; padding: 16px; background: var(--mat-sys-surface-container-low); }
    h2 { margin: 0 0 8px; font: var(--mat-sys-title-medium); }
    h3 { margin: 12px 0 4px; font: var(--mat-sys-title-small); }
    dl { display: grid; grid-template-columns: repeat(auto-fill, minmax(220px, 1fr)); gap: 8px 24px; margin: 0; }
    dt { color: var(--mat-sys-on-surface-variant); font: var(--mat-sys-label-medium); }
    dd { margin: 0; font: var(--mat-sys-title-medium); }
    .stale { color: var(--mat-sys-error); }
    .statement { margin: 8px 0 0; color: var(--mat-sys-on-surface-variant); }
    .history ul { margin: 4px 0 0; padding-left: 20px; font: var(--mat-sys-body-small); }
  `,
})
export class MeasureResult {
  readonly measurement = input.required<Measurement>();
  /** Results this measurement had before (edits, recomputes), newest first. */
  readonly history = input<MeasurementHistoryEntry[]>([]);

  protected readonly groups = computed(() => groupRows(resultRows(this.measurement().result)));
  protected readonly pixel = computed(() => `${formatUmPerPx(this.measurement().pixelSize.umPerPx)} (${this.measurement().pixelSize.source})`);

  protected line(h: MeasurementHistoryEntry): string {
    return historyLine(h);
  }
}
