import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ChartConfiguration, ChartData } from 'chart.js';
import { BaseChartDirective, provideCharts, withDefaultRegisterables } from 'ng2-charts';
import type { InterceptBar } from './summary-plot-data';

/** l̄ per band and direction: the 95 % interval as a floating bar, the mean as a point on it. Loaded only with the summary page. */
@Component({
  selector: 'ef-intercept-plot',
  imports: [BaseChartDirective],
  providers: [provideCharts(withDefaultRegisterables())],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <figure>
      <div class="chart">
        <canvas baseChart type="bar" [data]="data()" [options]="options()" role="img" [attr.aria-label]="description()"></canvas>
      </div>
      <figcaption>{{ caption() }}</figcaption>
    </figure>
  `,
  styles: `
    figure { margin: 0; }
    .chart { position: relative; height: 320px; }
    figcaption { margin-top: 4px; color: var(--mat-sys-on-surface-variant); font: var(--mat-sys-body-small); }
  `,
})
export class InterceptPlot {
  readonly bars = input.required<InterceptBar[]>();
  /** What the horizontal axis lists. */
  readonly axisTitle = input('Layer band · direction');
  readonly caption = input('Mean lineal intercept l̄ (µm) per layer band and direction; bars span the 95 % confidence interval across fields.');

  protected readonly data = computed<ChartData<'bar'>>(() => {
    const bars = this.bars();
    // A mixed chart: chart.js takes a line dataset inside a bar chart; its typings name one type only.
    const mixed = {
      labels: bars.map((b) => b.label),
      datasets: [
        {
          type: 'line',
          label: 'Mean l̄ (µm)',
          data: bars.map((b) => b.mean),
          showLine: false,
          pointRadius: 6,
          pointStyle: 'rectRot',
          backgroundColor: '#c8743a',
          borderColor: '#5a2f10',
        },
        {
          type: 'bar',
          label: '95 % interval (µm)',
          data: bars.map((b) => [b.low, b.high] as unknown as number),
          backgroundColor: 'rgba(42, 157, 143, 0.35)',
          borderColor: '#2a9d8f',
          borderWidth: 1,
          barPercentage: 0.35,
        },
      ],
    };
    return mixed as unknown as ChartData<'bar'>;
  });

  protected readonly description = computed(
    () => `Plot of mean lineal intercept: ${this.bars().map((b) => `${b.label} ${b.mean.toFixed(2)} µm (${b.low.toFixed(2)} to ${b.high.toFixed(2)})`).join('; ')}`,
  );

  protected readonly options = computed<ChartConfiguration<'bar'>['options']>(() => ({
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    scales: { y: { beginAtZero: true, title: { display: true, text: 'l̄ (µm)' } }, x: { title: { display: true, text: this.axisTitle() } } },
    plugins: { legend: { position: 'bottom' } },
  }));
}
