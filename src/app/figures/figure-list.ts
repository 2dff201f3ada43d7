import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input } from '@angular/core';
import { MatAnchor, MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { Title } from '@angular/platform-browser';
import { RouterLink } from '@angular/router';
import { remote } from '../core/remote';
import { Breadcrumbs, type Crumb } from '../archive/breadcrumbs';
import { ProjectApi } from '../projects/project-api';
import type { ReviewState } from '../../../shared/reviews';
import { reviewStateLabel } from '../reviews/review-text';
import { FigureApi } from './figure-api';

/** The project's saved figures, newest change first, with where each stands in review; and the way to compose a new one. */
@Component({
  selector: 'ef-figure-list',
  imports: [Breadcrumbs, DatePipe, MatAnchor, MatButton, MatIcon, MatProgressBar, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './figure-list.html',
  styleUrl: './figure-list.scss',
})
export default class FigureList {
  private readonly projects = inject(ProjectApi);
  private readonly figures = inject(FigureApi);
  private readonly title = inject(Title);

  readonly projectId = input.required<string>();

  protected readonly project = remote(() => this.projectId(), (id) => this.projects.get(id));
  protected readonly list = remote(() => this.projectId(), (id) => this.figures.list(id));
  protected readonly canCompose = computed(() => this.project.value()?.allowed.includes('editMetadata') ?? false);
  protected readonly crumbs = computed<Crumb[]>(() => [
    { label: 'Projects', link: ['/projects'] },
    { label: this.project.value()?.code ?? 'Project', link: ['/projects', this.projectId()] },
    { label: 'Figures' },
  ]);

  private readonly pageTitle = effect(() => {
    const p = this.project.value();
    if (p) this.title.setTitle(`Figures · ${p.code} · Etchfile`);
  });

  protected stateLabel(state: ReviewState): string {
    return reviewStateLabel(state);
  }
}
