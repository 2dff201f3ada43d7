import { ChangeDetectionStrategy, Component, computed, effect, inject, input, linkedSignal, signal } from '@angular/core';
import { MatAnchor, MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatOption, MatSelect } from '@angular/material/select';
import { Title } from '@angular/platform-browser';
import { Router, RouterLink } from '@angular/router';
import type { SampleDetail } from '../../../shared/archive/samples';
import type { Specimen } from '../../../shared/archive/specimens';
import { apiErrorMessage } from '../core/api-error-message';
import { askToConfirm } from '../core/confirm-dialog';
import { remote } from '../core/remote';
import { ProjectApi } from '../projects/project-api';
import { ArchiveApi } from './archive-api';
import { Breadcrumbs, type Crumb } from './breadcrumbs';
import { LayerStackPicture } from './layer-stack-picture';
import { RouteTimeline } from './route-timeline';
import { impliedStack, MAX_DRAWN_LAYERS } from './stack-geometry';
import type { SpecimenDialogData } from './specimen-dialog';
import { SpecimenTable } from './specimen-table';
import { StrainPlot } from './strain-plot';
import { timelineRows } from './timeline-rows';

/** One sample: its stack drawn to scale, its route as a timeline with what each step implies, its specimens. */
@Component({
  selector: 'ef-sample-page',
  imports: [
    Breadcrumbs,
    LayerStackPicture,
    MatAnchor,
    MatButton,
    MatFormField,
    MatIcon,
    MatLabel,
    MatOption,
    MatProgressBar,
    MatSelect,
    RouteTimeline,
    RouterLink,
    SpecimenTable,
    StrainPlot,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './sample-page.html',
  styleUrl: './archive-pages.scss',
})
export default class SamplePage {
  private readonly api = inject(ArchiveApi);
  private readonly projectApi = inject(ProjectApi);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  private readonly title = inject(Title);

  /** Route parameters. */
  readonly projectId = input.required<string>();
  readonly sampleId = input.required<string>();

  private readonly ids = computed(() => ({ projectId: this.projectId(), sampleId: this.sampleId() }));
  protected readonly project = remote(this.projectId, (id) => this.projectApi.get(id));
  protected readonly sample = remote(this.ids, ({ projectId, sampleId }) => this.api.getSample(projectId, sampleId));
  protected readonly specimens = remote(this.ids, ({ projectId, sampleId }) => this.api.listSpecimens(projectId, sampleId));
  protected readonly canEdit = computed(() => this.project.value()?.allowed.includes('editMetadata') ?? false);
  protected readonly canDelete = computed(() => this.project.value()?.allowed.includes('delete') ?? false);
  protected readonly crumbs = computed<Crumb[]>(() => [
    { label: 'Projects', link: ['/projects'] },
    { label: this.project.value()?.code ?? 'Project', link: ['/projects', this.projectId()] },
    { label: this.sample.value()?.code ?? 'Sample' },
  ]);
  protected readonly rows = computed(() => {
    const s = this.sample.value();
    return s ? timelineRows(s.layers.map((l) => l.designation), s.route, s.states) : [];
  });
  /** Which state the stack picture shows: 0 as stacked, i after step i; back to 0 for another sample. */
  protected readonly shownState = linkedSignal({ source: this.sampleId, computation: () => 0 });
  protected readonly stateOptions = computed(() =>
    this.rows().map((row) => ({ index: row.index, label: row.stepNumber === null ? 'As stacked' : `After step ${row.stepNumber}: ${row.typeLabel}` })),
  );
  protected readonly shownLayers = computed(() => {
    const s = this.sample.value();
    const state = s?.states[this.shownState()];
    if (!s || !state) return [];
    return impliedStack(s.layers, state);
  });
  protected readonly shownTooMany = computed(() => (this.sample.value()?.states[this.shownState()]?.layerCount ?? 0) > MAX_DRAWN_LAYERS);
  protected readonly shownCaption = computed(() => (this.shownState() === 0 ? 'as stacked' : `after step ${this.shownState()}`));
  protected readonly specimenList = computed(() => this.specimens.value() ?? []);
  protected readonly busy = signal(false);
  protected readonly actionError = signal('');

  private readonly codeInTitle = effect(() => {
    const s = this.sample.value();
    if (s) this.title.setTitle(`${s.code} · ${s.name} · Etchfile`);
  });

  protected showState(index: number): void {
    this.shownState.set(index);
  }

  protected async newSpecimen(sample: SampleDetail): Promise<void> {
    const { SpecimenDialog } = await import('./specimen-dialog');
    const data: SpecimenDialogData = { projectId: this.projectId(), sampleId: sample.id, route: sample.route, specimen: null };
    this.dialog
      .open<InstanceType<typeof SpecimenDialog>, SpecimenDialogData, Specimen>(SpecimenDialog, { data, width: '640px', maxHeight: '90vh' })
      .afterClosed()
      .subscribe((created) => {
        if (!created) return;
        this.specimens.reload();
        this.sample.reload();
      });
  }

  protected deleteSample(sample: SampleDetail): void {
    askToConfirm(this.dialog, {
      title: `Delete ${sample.code}?`,
      message: 'The sample, its layer stack and its process route are removed. A sample with specimens cannot be deleted.',
      confirmLabel: 'Delete',
    }).subscribe((confirmed) => {
      if (confirmed) this.sendDeletion(sample);
    });
  }

  private sendDeletion(sample: SampleDetail): void {
    this.busy.set(true);
    this.actionError.set('');
    this.api.deleteSample(this.projectId(), sample.id).subscribe({
      next: () => void this.router.navigate(['/projects', this.projectId()]),
      error: (error) => {
        this.actionError.set(apiErrorMessage(error).message);
        this.busy.set(false);
      },
    });
  }
}
