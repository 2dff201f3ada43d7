import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, effect, ElementRef, inject, input, model, output, signal, untracked, viewChild } from '@angular/core';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MatCheckbox } from '@angular/material/checkbox';
import { MatDialog } from '@angular/material/dialog';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatOption, MatSelect } from '@angular/material/select';
import type { AnnotationClass } from '../../../shared/annotations/annotations';
import { ANNOTATION_COLOURS, KINDS_FOR_SHAPE } from '../../../shared/annotations/kinds';
import { shapeProblem } from '../../../shared/annotations/shape-rules';
import type { ImageSize } from '../../../shared/viewer/viewport';
import { apiErrorMessage } from '../core/api-error-message';
import type { ShapeState } from './command-stack';
import { listWindow, scrollToRow } from './list-window';
import { measure, measurementLabel, positionLabel } from './measurements';
import { authorsOf, filterShapes, stateOf, type ViewShape } from './view-shapes';
import { ViewerApi } from './viewer-api';

/** Height of one list row, px (the windowed list needs it fixed). */
const ROW_HEIGHT = 48;

const KIND_NAMES: Record<ViewShape['kind'], string> = {
  polyline: 'Polyline',
  polygon: 'Outline',
  rectangle: 'Rectangle',
  point: 'Point',
  ruler: 'Ruler',
  angle: 'Angle',
  text: 'Note',
};

/**
 * The image's annotations beside the canvas: the selected one with its measurements and edits,
 * classes with their visibility, filters by class and author, the list (clicking one flies the
 * view to it), and GeoJSON export and import.
 */
@Component({
  selector: 'ef-annotation-panel',
  imports: [
    MatButton,
    MatCheckbox,
    MatFormField,
    MatIcon,
    MatIconButton,
    MatInput,
    MatLabel,
    MatOption,
    MatSelect,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './annotation-panel.html',
  styleUrl: './annotation-panel.scss',
})
export class AnnotationPanel {
  private readonly api = inject(ViewerApi);
  private readonly dialog = inject(MatDialog);

  readonly projectId = input.required<string>();
  readonly imageId = input.required<string>();
  readonly image = input.required<ImageSize>();
  readonly shapes = input.required<readonly ViewShape[]>();
  readonly classes = input.required<readonly AnnotationClass[]>();
  readonly selectedKey = input.required<string | null>();
  readonly umPerPx = input.required<number | null>();
  readonly canAnnotate = input.required<boolean>();
  readonly canEditClasses = input.required<boolean>();
  readonly hiddenClasses = model.required<ReadonlySet<string>>();
  readonly choose = output<string>();
  readonly change = output<{ key: string; state: ShapeState }>();
  readonly remove = output<string>();
  /** Classes or annotations changed on the server (class edits, import): load again. */
  readonly reload = output<'classes' | 'annotations'>();
  private readonly entries = viewChild<ElementRef<HTMLDivElement>>('entries');

  protected readonly classFilter = signal('');
  protected readonly authorFilter = signal('');
  protected readonly importing = signal(false);
  protected readonly importMessage = signal('');
  protected readonly importProblems = signal<string[]>([]);
  protected readonly exportError = signal('');
  protected readonly editError = signal('');

  protected readonly classById = computed(() => new Map(this.classes().map((c) => [c.id, c])));
  protected readonly authors = computed(() => authorsOf(this.shapes()));
  protected readonly counts = computed(() => {
    const counts = new Map<string, number>();
    for (const s of this.shapes()) counts.set(s.classId, (counts.get(s.classId) ?? 0) + 1);
    return counts;
  });
  protected readonly listed = computed(() => filterShapes(this.shapes(), { hiddenClasses: this.hiddenClasses(), classId: this.classFilter(), authorId: this.authorFilter() }));
  protected readonly selected = computed(() => this.shapes().find((s) => s.key === this.selectedKey()) ?? null);
  protected readonly selectedMeasures = computed(() => {
    const s = this.selected();
    return s ? measure(s.kind, s.points, this.umPerPx()) : [];
  });
  /** Classes the selected shape may move to. */
  protected readonly fittingClasses = computed(() => {
    const s = this.selected();
    return s ? this.classes().filter((c) => KINDS_FOR_SHAPE[c.shapeKind].includes(s.kind)) : [];
  });

  protected readonly rowHeight = ROW_HEIGHT;
  private readonly scrollTop = signal(0);
  private readonly listHeight = signal(400);
  protected readonly window = computed(() => {
    const w = listWindow(this.scrollTop(), this.listHeight(), ROW_HEIGHT, this.listed().length);
    return { ...w, rows: this.listed().slice(w.start, w.end) };
  });

  /** A shape chosen on the canvas scrolls into view in the list. */
  private readonly revealSelected = effect(() => {
    const key = this.selectedKey();
    const el = this.entries()?.nativeElement;
    if (!key || !el) return;
    const index = untracked(() => this.listed().findIndex((s) => s.key === key));
    if (index < 0) return;
    const top = scrollToRow(index, el.scrollTop, el.clientHeight, ROW_HEIGHT);
    if (top !== null) el.scrollTop = top;
  });

  private readonly measureList = effect((onCleanup) => {
    const el = this.entries()?.nativeElement;
    if (!el) return;
    const observer = new ResizeObserver(() => this.listHeight.set(el.clientHeight));
    observer.observe(el);
    onCleanup(() => observer.disconnect());
  });

  protected scrolled(el: HTMLDivElement): void {
    this.scrollTop.set(el.scrollTop);
    this.listHeight.set(el.clientHeight);
  }

  protected colour(classId: string): string {
    const c = this.classById().get(classId);
    return c ? ANNOTATION_COLOURS[c.colour] : ANNOTATION_COLOURS.slate;
  }

  protected className(classId: string): string {
    return this.classById().get(classId)?.name ?? 'Unknown class';
  }

  protected kindName(s: ViewShape): string {
    return KIND_NAMES[s.kind];
  }

  protected summary(s: ViewShape): string {
    if (s.kind === 'text') return s.label;
    if (s.kind === 'point') return [positionLabel(s.points[0]!, this.umPerPx()), s.label].filter(Boolean).join(' · ');
    return [measurementLabel(s.kind, s.points, this.umPerPx()), s.label].filter(Boolean).join(' · ');
  }

  protected entryName(s: ViewShape): string {
    return `${this.kindName(s)}, ${this.className(s.classId)}${this.summary(s) ? `, ${this.summary(s)}` : ''}, by ${s.authorName}`;
  }

  protected toggleClass(classId: string, shown: boolean): void {
    const next = new Set(this.hiddenClasses());
    if (shown) next.delete(classId);
    else next.add(classId);
    this.hiddenClasses.set(next);
  }

  protected setClass(s: ViewShape, classId: string): void {
    this.change.emit({ key: s.key, state: { ...stateOf(s), classId } });
  }

  protected setLabel(s: ViewShape, label: string): void {
    const trimmed = label.trim();
    if (trimmed === s.label) return;
    const problem = shapeProblem(s.kind, s.points, this.image(), trimmed);
    this.editError.set(problem ?? '');
    if (!problem) this.change.emit({ key: s.key, state: { ...stateOf(s), label: trimmed } });
  }

  protected exportGeoJson(): void {
    this.exportError.set('');
    this.api.exportGeoJson(this.projectId(), this.imageId()).subscribe({
      next: (blob) => {
        const url = URL.createObjectURL(blob);
        const a = document.createElement('a');
        a.href = url;
        a.download = `annotations-${this.imageId()}.geojson`;
        a.click();
        setTimeout(() => URL.revokeObjectURL(url), 10_000);
      },
      error: (err: HttpErrorResponse) => this.exportError.set(apiErrorMessage(err).message),
    });
  }

  protected async importGeoJson(input: HTMLInputElement): Promise<void> {
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    this.importMessage.set('');
    this.importProblems.set([]);
    this.importing.set(true);
    const text = await file.text();
    this.api.importGeoJson(this.projectId(), this.imageId(), text).subscribe({
      next: ({ imported }) => {
        this.importing.set(false);
        this.importMessage.set(`${imported} ${imported === 1 ? 'shape' : 'shapes'} imported from ${file.name}.`);
        this.reload.emit('annotations');
      },
      error: (err: HttpErrorResponse) => {
        this.importing.set(false);
        const body = err.error as { error?: { message?: string; details?: { message: string }[] } } | null;
        this.importMessage.set(apiErrorMessage(err).message);
        this.importProblems.set(body?.error?.details?.map((d) => d.message) ?? []);
      },
    });
  }

  protected async editClasses(): Promise<void> {
    const { ClassEditorDialog } = await import('./class-editor-dialog');
    this.dialog
      .open(ClassEditorDialog, { data: { projectId: this.projectId(), classes: this.classes() }, width: '640px', autoFocus: 'first-heading' })
      .afterClosed()
      .subscribe(() => this.reload.emit('classes'));
  }
}
