import { ChangeDetectionStrategy, Component, computed, effect, inject, input } from '@angular/core';
import { MatAnchor, MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { Title } from '@angular/platform-browser';
import { forkJoin, map, of, switchMap } from 'rxjs';
import { remote } from '../core/remote';
import { ImageApi } from '../archive/image-api';
import { Breadcrumbs, type Crumb } from '../archive/breadcrumbs';
import { ProjectApi } from '../projects/project-api';
import type { FieldImage } from './field-figure';
import { FieldFigures } from './field-figures';
import { InterceptPlot } from './intercept-plot';
import { PrintFrame } from './print-frame';
import { MeasurementsApi } from './measurements-api';
import { formatCount, formatG, formatLength, formatPercent, formatPlusMinusUm, formatUm } from './measure-units';
import { methodNotes } from './method-notes';
import { distanceBars, interceptBars, layerRows, rowLabel, subBandLabel, subBandRows } from './summary-plot-data';

/** Shown with every grain size summary (our wording of the research caution). */
export const SUMMARY_CAUTION =
  'These numbers support research; they do not certify material for structural use — follow the applicable standard and accredited practice.';

/** A specimen's grain size across its measured fields: table, plot, field figures, downloads and a printable method statement. */
@Component({
  selector: 'ef-grain-size-page',
  imports: [Breadcrumbs, FieldFigures, InterceptPlot, MatAnchor, MatButton, MatIcon, MatProgressBar, PrintFrame],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './grain-size-page.html',
  styleUrl: './grain-size-page.scss',
})
export default class GrainSizePage {
  private readonly api = inject(MeasurementsApi);
  private readonly imageApi = inject(ImageApi);
  private readonly projectApi = inject(ProjectApi);
  private readonly title = inject(Title);

  /** Route parameters. */
  readonly projectId = input.required<string>();
  readonly specimenId = input.required<string>();

  private readonly ids = computed(() => ({ projectId: this.projectId(), specimenId: this.specimenId() }));
  protected readonly project = remote(this.projectId, (id) => this.projectApi.get(id));
  protected readonly summary = remote(this.ids, ({ projectId, specimenId }) => this.api.summary(projectId, specimenId));
  /** The specimen's images with their measurements: the method statement (pattern, rules, calibration) and the field figures. */
  protected readonly fields = remote(this.ids, ({ projectId, specimenId }) =>
    this.imageApi.search(projectId, { page: 0, pageSize: 100, sort: 'uploadedAt', dir: 'asc', specimenId }).pipe(
      switchMap((page) =>
        page.items.length === 0
          ? of<FieldImage[]>([])
          : forkJoin(page.items.map((image) => this.api.list(projectId, image.id).pipe(map((measurements): FieldImage => ({ image, measurements }))))),
      ),
    ),
  );

  /** Layers and directions only: sub-bands are in the distance table below, not counted twice. */
  protected readonly rows = computed(() =>
    layerRows(this.summary.value()?.intercepts ?? []).map((r) => ({
      label: rowLabel(r),
      n: r.meanIntercept.n,
      mean: formatUm(r.meanIntercept.mean, 2),
      ci: formatPlusMinusUm(r.meanIntercept.ci95),
      ra: formatPercent(r.meanIntercept.relativeAccuracyPct),
      raWarning: r.meanIntercept.relativeAccuracyWarning,
      g: formatG(r.g),
      counts: `${formatCount(r.totalCount)} ${r.countSymbols.join('/')} on ${formatLength(r.totalLineLengthUm)}`,
      anisotropy: r.anisotropyIndex === null ? '' : r.anisotropyIndex.toFixed(2),
      notes: [
        ...r.warnings,
        ...(r.staleFields > 0 ? [`${r.staleFields} field(s) measured at an older pixel size: recompute them.`] : []),
        ...(r.emptyFields > 0 ? [`${r.emptyFields} field(s) with nothing counted were left out.`] : []),
      ],
    })),
  );
  protected readonly anyRaWarning = computed(() => [...this.rows(), ...this.distanceRows()].some((r) => r.raWarning));
  protected readonly bars = computed(() => interceptBars(layerRows(this.summary.value()?.intercepts ?? [])));
  /** l̄ per distance from the interfaces, when sub-bands were measured. */
  protected readonly distance = computed(() => distanceBars(this.summary.value()?.intercepts ?? []));
  protected readonly distanceRows = computed(() =>
    subBandRows(this.summary.value()?.intercepts ?? []).map((r) => ({
      label: subBandLabel(r),
      n: r.meanIntercept.n,
      mean: formatUm(r.meanIntercept.mean, 2),
      ci: formatPlusMinusUm(r.meanIntercept.ci95),
      ra: formatPercent(r.meanIntercept.relativeAccuracyPct),
      raWarning: r.meanIntercept.relativeAccuracyWarning,
      g: formatG(r.g),
    })),
  );
  protected readonly method = computed(() => methodNotes((this.fields.value() ?? []).flatMap((f) => f.measurements)));
  protected readonly caution = SUMMARY_CAUTION;
  protected readonly summaryCsv = computed(() => this.api.summaryCsvUrl(this.projectId(), this.specimenId()));
  protected readonly fieldsCsv = computed(() => this.api.fieldsCsvUrl(this.projectId(), this.specimenId()));
  protected readonly crumbs = computed<Crumb[]>(() => {
    const p = this.projectId();
    return [
      { label: 'Projects', link: ['/projects'] },
      { label: this.project.value()?.code ?? 'Project', link: ['/projects', p] },
      { label: this.summary.value()?.specimenCode ?? 'Specimen', link: ['/projects', p, 'specimens', this.specimenId()] },
      { label: 'Grain size summary' },
    ];
  });

  private readonly pageTitle = effect(() => {
    const s = this.summary.value();
    if (s) this.title.setTitle(`Grain size · ${s.specimenCode} · Etchfile`);
  });

  protected print(): void {
    window.print();
  }
}
