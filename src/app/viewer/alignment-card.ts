import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, linkedSignal, output, signal, untracked } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatSlider, MatSliderThumb } from '@angular/material/slider';
import { map } from 'rxjs';
import type { ImageAlignment } from '../../../shared/alignments';
import type { AnnotationClass } from '../../../shared/annotations/annotations';
import { ANNOTATION_COLOURS } from '../../../shared/annotations/kinds';
import type { ImageRecord, ImageSummary } from '../../../shared/images';
import { alignmentProblem, fitAlignment, MAX_PAIRS, MIN_PAIRS, type PointPair, type Vec2 } from '../../../shared/viewer/alignment';
import { apiErrorMessage } from '../core/api-error-message';
import { remote } from '../core/remote';
import type { AlignmentMark } from './alignment-layer';
import { summariseAlignment } from './alignment-summary';
import type { ComparePane, PaneSide } from './compare-pane';
import { ViewerApi } from './viewer-api';
import { fromAnnotation, isShown, type ViewShape } from './view-shapes';

/** A pair being picked: the main-image point comes first, then the matching one on the compared image. */
interface PickedPair {
  image: Vec2;
  other: Vec2 | null;
}

/**
 * What the compared pane shows beyond its tiles: its own annotations (read-only, in their class
 * colours) and the alignment with the main image — picking two or three point pairs, the fit and how
 * well the points agree, the saved alignment laid over the main image with an opacity, hiding,
 * re-aligning and clearing. The panes themselves are ComparePane's; this card drives them.
 */
@Component({
  selector: 'ef-alignment-card',
  imports: [MatButton, MatProgressBar, MatSlider, MatSliderThumb],
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '(document:keydown.escape)': 'cancelOnEscape()' },
  template: `
    <section class="card" aria-labelledby="alignment-heading">
      <h3 id="alignment-heading" class="visually-hidden">Alignment with the main image</h3>
      @if (saved.loading() && !picking()) {
        <mat-progress-bar mode="indeterminate" aria-label="Loading the alignment" />
      } @else if (saved.error()) {
        <p class="error" role="alert">{{ saved.error() }} <button mat-button type="button" (click)="saved.reload()">Try again</button></p>
      } @else if (picking()) {
        <p class="step" role="status" aria-live="polite">{{ stepText() }}</p>
        @if (pairs().length > 0) {
          <ol class="pairs" aria-label="Picked point pairs">
            @for (p of pairs(); track $index) {
              <li>
                Pair {{ $index + 1 }}: main ({{ p.image[0].toFixed(0) }}, {{ p.image[1].toFixed(0) }}) px
                @if (p.other) {
                  → compared ({{ p.other[0].toFixed(0) }}, {{ p.other[1].toFixed(0) }}) px
                } @else {
                  → waiting for the compared point
                }
              </li>
            }
          </ol>
        }
        @if (pairProblem()) {
          <p class="error" role="alert">{{ pairProblem() }}</p>
        }
        @if (preview(); as s) {
          <p class="quality">{{ s.what }}. {{ s.agreement }}</p>
          <p class="quality">{{ s.scale }}</p>
          @if (s.warning) {
            <p class="warning" role="status">{{ s.warning }}</p>
          }
        }
        <div class="actions">
          <button mat-flat-button type="button" [disabled]="!canSave()" (click)="save()">Save alignment</button>
          <button mat-button type="button" [disabled]="pairs().length === 0" (click)="undoPoint()">Undo last point</button>
          <button mat-button type="button" (click)="cancel()">Cancel</button>
        </div>
      } @else if (alignment(); as a) {
        @if (summary(); as s) {
          <p class="quality">{{ s.what }}, saved by {{ a.savedByName }}; both panes now follow the alignment. {{ s.agreement }}</p>
          <p class="quality">{{ s.scale }}</p>
          @if (s.warning) {
            <p class="warning" role="status">{{ s.warning }}</p>
          }
        }
        <div class="actions">
          <button mat-stroked-button type="button" [attr.aria-pressed]="shown()" (click)="shown.set(!shown())">{{ shown() ? 'Hide overlay' : 'Show overlay' }}</button>
          @if (shown()) {
            <label class="opacity">
              <span>Opacity {{ opacity() }} %</span>
              <mat-slider min="0" max="100" step="1" discrete>
                <input matSliderThumb aria-label="Overlay opacity" [value]="opacity()" (valueChange)="opacity.set($event)" />
              </mat-slider>
            </label>
          }
          @if (canAlign()) {
            <button mat-button type="button" (click)="startPicking()">Re-align</button>
            <button mat-button type="button" [disabled]="busy()" (click)="clear()">Clear alignment</button>
          }
        </div>
      } @else {
        <p class="empty">
          Not aligned with the main image: the panes are linked by position only.
          @if (!canAlign()) {
            Your role may not align images.
          }
        </p>
        @if (canAlign()) {
          <div class="actions">
            <button mat-stroked-button type="button" (click)="startPicking()">Align by point pairs</button>
          </div>
        }
      }
      @if (problem()) {
        <p class="error" role="alert">{{ problem() }}</p>
      }
      @if (shapes.error()) {
        <p class="error" role="alert">Annotations of this image could not be loaded: {{ shapes.error() }}</p>
      } @else if (shapes.value(); as list) {
        <p class="note">{{ list.length === 0 ? 'No annotations on this image.' : list.length + (list.length === 1 ? ' annotation' : ' annotations') + ' of this image shown (read-only).' }}</p>
      }
    </section>
  `,
  styles: `
    .card {
      display: flex;
      flex-direction: column;
      gap: 4px;
      padding: 6px 12px;
      background: var(--mat-sys-surface-container);
      font: var(--mat-sys-body-small);
    }
    p,
    ol {
      margin: 0;
    }
    .pairs {
      padding-left: 18px;
      font-family: var(--ef-mono);
    }
    .step {
      font-weight: 500;
    }
    .actions {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      gap: 4px 8px;
    }
    .opacity {
      display: flex;
      align-items: center;
      gap: 4px;
    }
    .opacity span {
      min-width: 88px;
      font-family: var(--ef-mono);
    }
    .empty,
    .note,
    .quality {
      color: var(--mat-sys-on-surface-variant);
    }
    .warning {
      color: var(--mat-sys-on-tertiary-container);
    }
    .error {
      color: var(--mat-sys-error);
    }
    .visually-hidden {
      position: absolute;
      width: 1px;
      height: 1px;
      overflow: hidden;
      clip-path: inset(50%);
    }
  `,
})
export class AlignmentCard {
  private readonly api = inject(ViewerApi);

  readonly projectId = input.required<string>();
  readonly image = input.required<ImageRecord>();
  readonly other = input.required<ImageSummary>();
  /** The compared pane, once its stage is up. */
  readonly pane = input<ComparePane | null>(null);
  readonly canAlign = input(false);
  readonly classes = input<readonly AnnotationClass[]>([]);
  readonly hiddenClasses = input<ReadonlySet<string>>(new Set());
  /** The main pane's tool: picking needs the select tool, or clicks would also draw. */
  readonly tool = input<string>('select');
  /** Picking started: the main pane should take clicks with the select tool, not draw. */
  readonly pickingStarted = output<void>();
  /** Whether these two images have a saved alignment (the panes then follow it). */
  readonly alignedChange = output<boolean>();

  protected readonly saved = remote(
    () => ({ projectId: this.projectId(), imageId: this.image().id, otherId: this.other().id }),
    (p) => this.api.alignments(p.projectId, p.imageId).pipe(map((list) => list.find((a) => a.otherImageId === p.otherId) ?? null)),
  );
  protected readonly shapes = remote(
    () => ({ projectId: this.projectId(), otherId: this.other().id }),
    (p) => this.api.annotations(p.projectId, p.otherId),
  );
  /** The saved alignment of exactly these two images (the last pair's value stays while the next loads). */
  protected readonly alignment = computed<ImageAlignment | null>(() => {
    const a = this.saved.value();
    return a && a.imageId === this.image().id && a.otherImageId === this.other().id ? a : null;
  });
  /** Picking starts afresh whenever another image is compared. */
  protected readonly picking = linkedSignal({ source: () => this.other().id, computation: () => false });
  protected readonly pairs = linkedSignal<string, PickedPair[]>({ source: () => this.other().id, computation: () => [] });
  protected readonly shown = signal(true);
  /** Overlay opacity, %. */
  protected readonly opacity = signal(50);
  protected readonly problem = signal('');
  protected readonly busy = signal(false);

  private readonly complete = computed<PointPair[]>(() => this.pairs().flatMap((p) => (p.other ? [{ image: p.image, other: p.other }] : [])));
  private readonly nextSide = computed<PaneSide>(() => (this.pairs().at(-1)?.other === null ? 'other' : 'main'));
  protected readonly pairProblem = computed(() => (this.complete().length >= MIN_PAIRS ? alignmentProblem(this.complete()) : null));
  protected readonly canSave = computed(
    () => !this.busy() && this.complete().length >= MIN_PAIRS && this.complete().length === this.pairs().length && !this.pairProblem(),
  );
  protected readonly preview = computed(() => {
    if (this.complete().length < MIN_PAIRS || this.pairProblem()) return null;
    return summariseAlignment(fitAlignment(this.complete()), this.image().pixelSize.xUm, this.other().pixelSize.xUm);
  });
  protected readonly summary = computed(() => {
    const a = this.alignment();
    return a ? summariseAlignment(fitAlignment(a.pairs), this.image().pixelSize.xUm, this.other().pixelSize.xUm) : null;
  });
  protected readonly stepText = computed(() => {
    const n = this.pairs().length;
    const done = this.complete().length;
    if (this.nextSide() === 'other') return `Pair ${n}: click the same feature on ${this.other().originalName} (the compared pane).`;
    if (done >= MAX_PAIRS) return 'Three pairs picked: save the alignment, or undo a point.';
    if (done >= MIN_PAIRS) return `Save now (scale, rotation, shift), or click a third point on the main image for an affine fit.`;
    return `Pair ${n + 1}: click a distinct feature on the main image. Drag to pan and scroll to zoom as usual.`;
  });

  private readonly stopPickingForOtherTools = effect(() => {
    if (this.tool() !== 'select' && untracked(() => this.picking())) {
      untracked(() => {
        this.cancel();
        this.problem.set('Picking points stopped because a drawing tool was chosen; start picking again.');
      });
    }
  });

  private readonly reportAligned = effect(() => {
    const aligned = this.alignment() !== null;
    untracked(() => this.alignedChange.emit(aligned));
  });

  private readonly pushAlignment = effect(() => {
    const pane = this.pane();
    const a = this.alignment();
    if (pane) untracked(() => pane.setAlignment(a?.transform ?? null));
  });

  private readonly pushOverlay = effect(() => {
    const pane = this.pane();
    const shown = this.shown();
    const opacity = this.opacity() / 100;
    if (pane) untracked(() => pane.setOverlay(shown, opacity));
  });

  private readonly pushPicking = effect(() => {
    const pane = this.pane();
    const picking = this.picking();
    if (pane) untracked(() => pane.setPicking(picking ? (side, p) => this.pick(side, p) : null));
  });

  private readonly pushMarks = effect(() => {
    const pane = this.pane();
    const pairs = this.picking() ? this.pairs() : [];
    const main: AlignmentMark[] = pairs.map((p, i) => ({ n: i + 1, at: p.image }));
    const other: AlignmentMark[] = pairs.flatMap((p, i) => (p.other ? [{ n: i + 1, at: p.other }] : []));
    if (pane) untracked(() => pane.setMarks(main, other));
  });

  private readonly pushShapes = effect(() => {
    const pane = this.pane();
    const list = this.shapes.value() ?? [];
    const colours = new Map(this.classes().map((c) => [c.id, ANNOTATION_COLOURS[c.colour]]));
    const hidden = this.hiddenClasses();
    if (!pane) return;
    const shapes: ViewShape[] = list.map((a) => fromAnnotation(a));
    untracked(() => pane.setShapes(shapes, (s) => colours.get(s.classId) ?? ANNOTATION_COLOURS.slate, (s) => isShown(s, hidden)));
  });

  protected startPicking(): void {
    this.problem.set('');
    this.pairs.set([]);
    this.picking.set(true);
    this.pickingStarted.emit();
  }

  protected undoPoint(): void {
    this.problem.set('');
    this.pairs.update((list) => {
      const last = list.at(-1);
      if (!last) return list;
      return last.other ? [...list.slice(0, -1), { image: last.image, other: null }] : list.slice(0, -1);
    });
  }

  /** Escape while picking drops the picked points (the page's own Escape handling runs as well). */
  protected cancelOnEscape(): void {
    if (this.picking()) this.cancel();
  }

  protected cancel(): void {
    this.problem.set('');
    this.pairs.set([]);
    this.picking.set(false);
  }

  protected save(): void {
    const pairs = this.complete();
    const problem = alignmentProblem(pairs);
    if (problem) return this.problem.set(problem);
    this.busy.set(true);
    this.api.saveAlignment(this.projectId(), this.image().id, this.other().id, { pairs: pairs.map((p) => ({ image: [p.image[0], p.image[1]], other: [p.other[0], p.other[1]] })) }).subscribe({
      next: (saved) => {
        this.busy.set(false);
        this.saved.set(saved);
        this.pairs.set([]);
        this.picking.set(false);
        this.shown.set(true);
        this.problem.set('');
      },
      error: (err: HttpErrorResponse) => {
        this.busy.set(false);
        this.problem.set(apiErrorMessage(err).message);
      },
    });
  }

  protected clear(): void {
    this.busy.set(true);
    this.api.removeAlignment(this.projectId(), this.image().id, this.other().id).subscribe({
      next: () => {
        this.busy.set(false);
        this.saved.set(null);
        this.problem.set('');
      },
      error: (err: HttpErrorResponse) => {
        this.busy.set(false);
        this.problem.set(apiErrorMessage(err).message);
      },
    });
  }

  /** A click on either pane while picking: only the side whose turn it is counts. */
  private pick(side: PaneSide, p: [number, number]): void {
    const expected = this.nextSide();
    if (side !== expected) {
      this.problem.set(expected === 'other' ? `Now click the matching feature on ${this.other().originalName}, in the compared pane.` : 'Start each pair on the main image.');
      return;
    }
    if (side === 'main' && this.complete().length >= MAX_PAIRS) {
      this.problem.set('Three pairs is the most: save the alignment, or undo a point.');
      return;
    }
    const size = side === 'main' ? this.image() : this.other();
    if (p[0] < 0 || p[1] < 0 || p[0] > size.width || p[1] > size.height) {
      this.problem.set('That click was beside the image; click on a feature of the image itself.');
      return;
    }
    this.problem.set('');
    const at: Vec2 = [round(p[0]), round(p[1])];
    if (side === 'main') this.pairs.update((list) => [...list, { image: at, other: null }]);
    else this.pairs.update((list) => [...list.slice(0, -1), { image: list.at(-1)!.image, other: at }]);
  }
}

/** Tenths of a pixel: finer than any click. */
function round(v: number): number {
  return Math.round(v * 10) / 10;
}
