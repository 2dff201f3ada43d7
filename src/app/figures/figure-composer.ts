import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, viewChild } from '@angular/core';
import { MatAnchor, MatButton } from '@angular/material/button';
import { MatCheckbox } from '@angular/material/checkbox';
import { MatDialog } from '@angular/material/dialog';
import { MatFormField, MatHint, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { Title } from '@angular/platform-browser';
import { Router, RouterLink } from '@angular/router';
import { catchError, forkJoin, map, of } from 'rxjs';
import { isApiErrorBody } from '../../../shared/api-error';
import type { Figure, FigureSpec, PanelSpec } from '../../../shared/figures';
import type { ImageSummary } from '../../../shared/images';
import { Breadcrumbs, type Crumb } from '../archive/breadcrumbs';
import { ImageApi } from '../archive/image-api';
import { apiErrorMessage } from '../core/api-error-message';
import { askToConfirm } from '../core/confirm-dialog';
import { remote } from '../core/remote';
import { ProjectApi } from '../projects/project-api';
import type { Mentionable } from '../reviews/comment-box';
import { ReviewPanel } from '../reviews/review-panel';
import { reviewStateLabel } from '../reviews/review-text';
import { ThreadList } from '../reviews/thread-list';
import { FigureApi } from './figure-api';
import { blankFigure, blankPanel, figureBodyOf, type PanelDraft } from './figure-draft';
import { barLengthsUm, moveItem, relabel, sortProblems, wholeImage, type SortedProblems } from './figure-geometry';
import { ExportPanel } from './export-panel';
import { LayoutPreview } from './layout-preview';
import { PanelEditor } from './panel-editor';

const NO_PROBLEMS: SortedProblems = { panels: {}, figure: {} };

/** Composes one figure (new or saved): its layout, its panels, a live preview, save and export; its review and threads. */
@Component({
  selector: 'ef-figure-composer',
  imports: [
    Breadcrumbs,
    ExportPanel,
    LayoutPreview,
    MatAnchor,
    MatButton,
    MatCheckbox,
    MatFormField,
    MatHint,
    MatIcon,
    MatInput,
    MatLabel,
    MatProgressBar,
    PanelEditor,
    ReviewPanel,
    RouterLink,
    ThreadList,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './figure-composer.html',
  styleUrl: './figure-composer.scss',
})
export default class FigureComposer {
  private readonly projects = inject(ProjectApi);
  private readonly figures = inject(FigureApi);
  private readonly imageApi = inject(ImageApi);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  private readonly pageTitle = inject(Title);

  readonly projectId = input.required<string>();
  /** Absent on /figures/new. */
  readonly figureId = input<string>();
  /** Query parameter: a thread to show (notification links carry it). */
  readonly thread = input<string | undefined>();

  protected readonly reviewPanel = viewChild(ReviewPanel);

  protected readonly project = remote(() => this.projectId(), (id) => this.projects.get(id));
  protected readonly classes = remote(() => this.projectId(), (id) => this.figures.annotationClasses(id));
  protected readonly figure = remote(
    () => ({ projectId: this.projectId(), figureId: this.figureId() }),
    ({ projectId, figureId }) => (figureId ? this.figures.get(projectId, figureId) : of(null)),
  );

  protected readonly head = signal<Omit<FigureSpec, 'panels'>>(blankFigure());
  protected readonly panels = signal<PanelDraft[]>([{ key: 1, spec: blankPanel(0) }]);
  protected readonly version = signal<number | null>(null);
  protected readonly imagesById = signal<Record<string, ImageSummary>>({});
  protected readonly imagesError = signal<string | null>(null);
  protected readonly dirty = signal(false);
  protected readonly saving = signal(false);
  protected readonly saveMessage = signal<string | null>(null);
  protected readonly savedNote = signal<string | null>(null);
  protected readonly problems = signal<SortedProblems>(NO_PROBLEMS);
  private nextKey = 2;

  protected readonly canCompose = computed(() => this.project.value()?.allowed.includes('editMetadata') ?? false);
  protected readonly canDelete = computed(() => (this.project.value()?.allowed.includes('delete') ?? false) && !!this.figureId());
  protected readonly isNew = computed(() => !this.figureId());
  protected readonly canComment = computed(() => this.project.value()?.allowed.includes('comment') ?? false);
  protected readonly members = computed<Mentionable[]>(() =>
    (this.project.value()?.members ?? []).map((m) => ({ id: m.userId, name: m.displayName, email: m.email })),
  );
  /** Letters of the saved figure's panels: threads pin to a saved panel's place. */
  protected readonly savedLetters = computed(() => (this.figure.value()?.panels ?? []).map((p) => p.letter));
  protected readonly stateLabel = computed(() => {
    const figure = this.figure.value();
    return figure ? reviewStateLabel(figure.reviewState) : null;
  });
  /** Reviewers see the saved figure: no move while the screen shows edits that are not saved. */
  protected readonly holdMoves = computed(() => (this.dirty() && this.canCompose() ? 'Save the figure before a review step: reviewers see the saved version.' : ''));
  protected readonly unsavedExport = computed(() => this.isNew() || (this.dirty() && this.canCompose()));
  protected readonly spec = computed<FigureSpec>(() => ({ ...this.head(), panels: this.panels().map((p) => p.spec) }));
  protected readonly keys = computed(() => this.panels().map((p) => p.key));
  protected readonly barLengths = computed(() => {
    const images = this.imagesById();
    return barLengthsUm(
      this.panels().map(({ spec }) => ({
        regionWidth: spec.region.width,
        xUm: images[spec.imageId]?.pixelSize.xUm ?? null,
        fixedUm: spec.scaleBar.lengthUm,
        show: spec.scaleBar.show,
      })),
      this.head().commonScaleBar,
    );
  });
  protected readonly heading = computed(() => this.figure.value()?.title ?? (this.isNew() ? 'New figure' : 'Figure'));
  protected readonly crumbs = computed<Crumb[]>(() => [
    { label: 'Projects', link: ['/projects'] },
    { label: this.project.value()?.code ?? 'Project', link: ['/projects', this.projectId()] },
    { label: 'Figures', link: ['/projects', this.projectId(), 'figures'] },
    { label: this.heading() },
  ]);
  protected readonly titleProblem = computed(() => this.problems().figure['title'] ?? null);
  protected readonly columnsProblem = computed(() => {
    const c = this.head().columns;
    return this.problems().figure['columns'] ?? (!Number.isInteger(c) || c < 1 || c > 6 ? 'Between 1 and 6 columns.' : null);
  });
  protected readonly gapProblem = computed(() => {
    const g = this.head().gapMm;
    return this.problems().figure['gapMm'] ?? (!Number.isFinite(g) || g < 0 || g > 20 ? 'Between 0 and 20 mm.' : null);
  });
  protected readonly panelsProblem = computed(() => this.problems().figure['panels'] ?? null);

  private readonly applyLoaded = effect(() => {
    const figure = this.figure.value();
    if (figure) this.applyFigure(figure);
  });
  private readonly setPageTitle = effect(() => {
    const code = this.project.value()?.code;
    if (code) this.pageTitle.setTitle(`${this.heading()} · ${code} · Etchfile`);
  });

  /** True while edits are not saved (the route's leave guard asks before dropping them). */
  hasUnsavedChanges(): boolean {
    return this.dirty() && !this.saving() && this.canCompose();
  }

  protected setHead(change: Partial<Omit<FigureSpec, 'panels'>>): void {
    this.head.update((h) => ({ ...h, ...change }));
    this.touch();
  }

  protected addPanel(): void {
    this.panels.update((list) => [...list, { key: this.nextKey++, spec: blankPanel(list.length) }]);
    this.touch();
  }

  protected changePanel(index: number, spec: PanelSpec): void {
    this.panels.update((list) => list.map((p, i) => (i === index ? { ...p, spec } : p)));
    this.problems.update((s) => ({ ...s, panels: { ...s.panels, [index]: [] } }));
    this.touch();
  }

  protected pickImage(index: number, image: ImageSummary): void {
    this.imagesById.update((map) => ({ ...map, [image.id]: image }));
    const spec = this.panels()[index]!.spec;
    this.changePanel(index, { ...spec, imageId: image.id, region: wholeImage(image.width, image.height) });
  }

  protected movePanel(index: number, step: -1 | 1): void {
    const order = moveItem(this.panels().map((_, i) => i), index, index + step);
    this.reorder(order);
  }

  protected removePanel(index: number): void {
    const order = this.panels().map((_, i) => i).filter((i) => i !== index);
    this.reorder(order);
  }

  protected saveFigure(): void {
    const body = figureBodyOf(this.head(), this.panels());
    const figureId = this.figureId();
    const version = this.version();
    this.saving.set(true);
    this.saveMessage.set(null);
    this.savedNote.set(null);
    const request = figureId && version !== null ? this.figures.update(this.projectId(), figureId, { ...body, version }) : this.figures.create(this.projectId(), body);
    request.subscribe({
      next: (saved) => {
        this.saving.set(false);
        this.problems.set(NO_PROBLEMS);
        if (!figureId) {
          this.dirty.set(false);
          void this.router.navigate(['/projects', this.projectId(), 'figures', saved.id], { replaceUrl: true });
          return;
        }
        const wasCleared = this.figure.value()?.reviewState === 'cleared';
        this.figure.set(saved);
        this.savedNote.set(
          wasCleared && saved.reviewState === 'draft'
            ? `Saved as version ${saved.version}. The figure was cleared; it is a draft again, and the cleared export stays below.`
            : `Saved as version ${saved.version}.`,
        );
        // An edit returns a cleared figure to draft: show the review as it stands now.
        this.reviewPanel()?.refresh();
      },
      error: (error: unknown) => this.showSaveFailure(error),
    });
  }

  protected deleteFigure(): void {
    const figureId = this.figureId();
    if (!figureId) return;
    askToConfirm(this.dialog, {
      title: 'Delete this figure?',
      message: `“${this.head().title}” and its layout go; the micrographs and earlier exported files stay.`,
      confirmLabel: 'Delete figure',
    }).subscribe((yes) => {
      if (!yes) return;
      this.figures.remove(this.projectId(), figureId).subscribe({
        next: () => {
          this.dirty.set(false);
          void this.router.navigate(['/projects', this.projectId(), 'figures']);
        },
        error: (error: unknown) => this.saveMessage.set(messageOf(error)),
      });
    });
  }

  /** A review move changed the state: the badge in the header follows. */
  protected showMoved(state: Figure['reviewState']): void {
    const figure = this.figure.value();
    if (figure) this.figure.set({ ...figure, reviewState: state });
  }

  protected problemsOf(index: number): string[] {
    return this.problems().panels[index] ?? [];
  }

  protected imageOf(spec: PanelSpec): ImageSummary | null {
    return this.imagesById()[spec.imageId] ?? null;
  }

  protected numberOf(text: string): number {
    return text.trim() === '' ? Number.NaN : Number(text.replace(',', '.'));
  }

  private reorder(order: number[]): void {
    const before = this.panels();
    const moved = order.map((i) => before[i]!);
    const letters = relabel(moved.map((p) => p.spec.letter), order);
    this.panels.set(moved.map((p, i) => ({ ...p, spec: { ...p.spec, letter: letters[i]! } })));
    this.problems.set(NO_PROBLEMS);
    this.touch();
  }

  private touch(): void {
    this.dirty.set(true);
    this.savedNote.set(null);
  }

  private applyFigure(figure: Figure): void {
    const { title, columns, gapMm, commonScaleBar, widthMm, dpi, panels } = figure;
    this.head.set({ title, columns, gapMm, commonScaleBar, widthMm, dpi });
    this.panels.set(panels.map((spec) => ({ key: this.nextKey++, spec })));
    this.version.set(figure.version);
    this.dirty.set(false);
    this.loadImages(panels.map((p) => p.imageId));
  }

  private loadImages(ids: string[]): void {
    const known = this.imagesById();
    const missing = [...new Set(ids)].filter((id) => id && !known[id]);
    if (missing.length === 0) return;
    this.imagesError.set(null);
    // One image that is gone must not keep the others from showing: each failure becomes null.
    const loads = missing.map((id) =>
      this.imageApi.get(this.projectId(), id).pipe(
        map((image): ImageSummary | string => image),
        catchError((error: unknown) => of(messageOf(error))),
      ),
    );
    forkJoin(loads).subscribe((results) => {
      const found = results.filter((r): r is ImageSummary => typeof r !== 'string');
      const failures = results.filter((r): r is string => typeof r === 'string');
      this.imagesById.update((known) => ({ ...known, ...Object.fromEntries(found.map((i) => [i.id, i])) }));
      if (failures.length > 0) {
        this.imagesError.set(`${failures.length} panel image${failures.length === 1 ? '' : 's'} could not be loaded (${failures[0]}). Choose another image for those panels or remove them.`);
      }
    });
  }

  private showSaveFailure(error: unknown): void {
    this.saving.set(false);
    if (!(error instanceof HttpErrorResponse)) {
      this.saveMessage.set('The figure could not be saved. Try again.');
      return;
    }
    const failure = apiErrorMessage(error);
    if (error.status === 409) {
      // The server's sentence asks to reload; this screen has just done so.
      const stale = failure.message.replace(/\s*Reload, then edit again\.?/, '');
      this.saveMessage.set(`${stale} The newest version is shown now; make your change again.`);
      this.figure.reload();
      return;
    }
    const details = isApiErrorBody(error.error) ? (error.error.error.details ?? []) : [];
    const sorted = sortProblems(details);
    this.problems.set(sorted);
    const placed = Object.keys(sorted.panels).length > 0 || ['title', 'columns', 'gapMm', 'panels'].some((k) => k in sorted.figure);
    this.saveMessage.set(placed ? 'The figure was not saved. Check the marked fields and panels.' : failure.message);
  }
}

function messageOf(error: unknown): string {
  return error instanceof HttpErrorResponse ? apiErrorMessage(error).message : 'Something went wrong. Try again.';
}
