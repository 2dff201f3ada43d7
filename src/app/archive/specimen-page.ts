import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal } from '@angular/core';
import { MatAnchor, MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { Title } from '@angular/platform-browser';
import { Router, RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { SECTION_PLANE_LABELS, type Specimen } from '../../../shared/archive/specimens';
import { apiErrorMessage } from '../core/api-error-message';
import { askToConfirm } from '../core/confirm-dialog';
import { remote } from '../core/remote';
import { ProjectApi } from '../projects/project-api';
import { ArchiveApi } from './archive-api';
import { Breadcrumbs, type Crumb } from './breadcrumbs';
import { EtchantCaution } from './etchant-caution';
import { LocationList } from './location-list';
import { formatEtchingTime } from './quantities';
import type { SpecimenDialogData } from './specimen-dialog';
import { SpecimenImages } from './specimen-images';

/** One specimen: how it was cut and prepared, the caution if etched, its locations, and its images. */
@Component({
  selector: 'ef-specimen-page',
  imports: [Breadcrumbs, DatePipe, EtchantCaution, LocationList, MatAnchor, MatButton, MatIcon, MatProgressBar, RouterLink, SpecimenImages],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './specimen-page.html',
  styleUrl: './archive-pages.scss',
})
export default class SpecimenPage {
  private readonly api = inject(ArchiveApi);
  private readonly projectApi = inject(ProjectApi);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  private readonly title = inject(Title);

  /** Route parameters. */
  readonly projectId = input.required<string>();
  readonly specimenId = input.required<string>();

  private readonly ids = computed(() => ({ projectId: this.projectId(), specimenId: this.specimenId() }));
  protected readonly project = remote(this.projectId, (id) => this.projectApi.get(id));
  protected readonly specimen = remote(this.ids, ({ projectId, specimenId }) => this.api.getSpecimen(projectId, specimenId));
  protected readonly canEdit = computed(() => this.project.value()?.allowed.includes('editMetadata') ?? false);
  protected readonly canDelete = computed(() => this.project.value()?.allowed.includes('delete') ?? false);
  protected readonly canUpload = computed(() => this.project.value()?.allowed.includes('upload') ?? false);
  protected readonly crumbs = computed<Crumb[]>(() => {
    const s = this.specimen.value();
    return [
      { label: 'Projects', link: ['/projects'] },
      { label: this.project.value()?.code ?? 'Project', link: ['/projects', this.projectId()] },
      ...(s ? [{ label: s.sampleCode, link: ['/projects', this.projectId(), 'samples', s.sampleId] }] : []),
      { label: s?.code ?? 'Specimen' },
    ];
  });
  protected readonly planeLabel = computed(() => {
    const s = this.specimen.value();
    return s ? SECTION_PLANE_LABELS[s.sectionPlane] : '';
  });
  protected readonly etchingTime = computed(() => formatEtchingTime(this.specimen.value()?.preparation.etchingTimeS ?? null));
  protected readonly imageCount = computed(() => (this.specimen.value()?.locations ?? []).reduce((n, l) => n + l.imageCount, 0));
  protected readonly busy = signal(false);
  protected readonly actionError = signal('');

  private readonly codeInTitle = effect(() => {
    const s = this.specimen.value();
    if (s) this.title.setTitle(`${s.code} · ${s.sampleCode} · Etchfile`);
  });

  protected async editSpecimen(specimen: Specimen): Promise<void> {
    this.busy.set(true);
    this.actionError.set('');
    try {
      // The dialog offers the sample's steps; fetch the route as it is now.
      const [{ SpecimenDialog }, sample] = await Promise.all([
        import('./specimen-dialog'),
        firstValueFrom(this.api.getSample(this.projectId(), specimen.sampleId)),
      ]);
      const data: SpecimenDialogData = { projectId: this.projectId(), sampleId: sample.id, route: sample.route, specimen };
      this.dialog
        .open<InstanceType<typeof SpecimenDialog>, SpecimenDialogData, Specimen>(SpecimenDialog, { data, width: '640px', maxHeight: '90vh' })
        .afterClosed()
        .subscribe((saved) => {
          if (saved) this.specimen.set(saved);
        });
    } catch (error) {
      // Loading the sample failed (gone, or no connection): say so instead of opening a dialog without steps.
      this.actionError.set(apiErrorMessage(error as { status: number; error: unknown }).message);
    } finally {
      this.busy.set(false);
    }
  }

  protected deleteSpecimen(specimen: Specimen): void {
    askToConfirm(this.dialog, {
      title: `Delete specimen ${specimen.code}?`,
      message: 'The specimen and its locations are removed. A specimen with images cannot be deleted.',
      confirmLabel: 'Delete',
    }).subscribe((confirmed) => {
      if (confirmed) this.sendDeletion(specimen);
    });
  }

  private sendDeletion(specimen: Specimen): void {
    this.busy.set(true);
    this.actionError.set('');
    this.api.deleteSpecimen(this.projectId(), specimen.id).subscribe({
      next: () => void this.router.navigate(['/projects', this.projectId(), 'samples', specimen.sampleId]),
      error: (error) => {
        this.actionError.set(apiErrorMessage(error).message);
        this.busy.set(false);
      },
    });
  }
}
