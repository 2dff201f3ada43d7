import { ChangeDetectionStrategy, Component, computed, effect, ElementRef, inject, input, linkedSignal, OnDestroy, signal, untracked, viewChild } from '@angular/core';
import { MatButton, MatIconButton } from '@angular/material/button';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatOption, MatSelect } from '@angular/material/select';
import { MatTab, MatTabGroup } from '@angular/material/tabs';
import { MatTooltip } from '@angular/material/tooltip';
import { Title } from '@angular/platform-browser';
import { RouterLink } from '@angular/router';
import type { Coordinates } from '../../../shared/annotations/annotations';
import { ANNOTATION_COLOURS, KINDS_FOR_SHAPE, type AnnotationColour, type AnnotationKind } from '../../../shared/annotations/kinds';
import type { Point } from '../../../shared/annotations/geometry';
import { shapeProblem } from '../../../shared/annotations/shape-rules';
import type { ImageRecord, ImageSummary } from '../../../shared/images';
import { actualPixels, fitViewport, imageToScreen, panBy, zoomAround, type Viewport } from '../../../shared/viewer/viewport';
import { remote } from '../core/remote';
import { SessionStore } from '../core/session-store';
import { AlignmentCard } from './alignment-card';
import { AnnotationPanel } from './annotation-panel';
import { AnnotationStore } from './annotation-store';
import type { Mentionable } from '../reviews/comment-box';
import { CalibrateCard } from './calibrate-card';
import { CommentsPanel } from './comments-panel';
import { formatPixelSize } from './calibration-input';
import type { ShapeState } from './command-stack';
import { ComparePane, frameOf, type StageModules } from './compare-pane';
import { DisplayPanel } from './display-panel';
import { ImagePanel } from './image-panel';
import { linkedByMicrometres } from './linked-view';
import { cursorReadout } from './measurements';
import type { MicrographStage } from './micrograph-stage';
import { draftOverlay, selectionOverlay } from './overlay-content';
import { NoteCard } from './note-card';
import { OverviewMap } from './overview-map';
import { PinCard } from './pin-card';
import { ReviewPinBoard } from './review-pin-board';
import { anchorFromDraft, cardNear, pinFrame } from './review-pins';
import { ScaleBar } from './scale-bar';
import { KIND_OF_TOOL, type FinishedDraft, type ShapeDraft } from './shape-draft';
import { ShortcutHelp } from './shortcut-help';
import { actionForKey, isTypingTarget, mayPickTool, TOOL_HINTS, type ShortcutAction, type ToolRights, type ViewerTool } from './shortcuts';
import { isNeutralTone, NEUTRAL_TONE, toneTransfer, type Tone } from './tone';
import { ToolRail } from './tool-rail';
import { fly } from './view-flight';
import { centreOn, keepInView, resizeViewport, viewportForBounds } from './view-maths';
import { previewUrl, tileUrl, ViewerApi } from './viewer-api';
import type { ViewerInteraction } from './viewer-interaction';
import { isShown, type ViewShape } from './view-shapes';

const ZOOM_STEP = 1.5;
/** How long the side panels wait for the first tiles at most. */
const FIRST_TILES_WAIT_MS = 1000;

/**
 * The micrograph viewer: tiles on a konva stage (loaded only on this page), annotation tools,
 * measurements in calibrated units, calibration by a drawn line, and the side panels.
 */
@Component({
  selector: 'ef-viewer-page',
  imports: [
    AlignmentCard,
    AnnotationPanel,
    CalibrateCard,
    CommentsPanel,
    DisplayPanel,
    ImagePanel,
    MatButton,
    MatFormField,
    MatIcon,
    MatIconButton,
    MatLabel,
    MatOption,
    MatProgressBar,
    MatSelect,
    MatTab,
    MatTabGroup,
    MatTooltip,
    NoteCard,
    OverviewMap,
    PinCard,
    RouterLink,
    ScaleBar,
    ShortcutHelp,
    ToolRail,
  ],
  providers: [AnnotationStore, ReviewPinBoard],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './viewer-page.html',
  styleUrl: './viewer-page.scss',
  host: {
    '(document:keydown)': 'handleKeyDown($event)',
    '(document:keyup)': 'handleKeyUp($event)',
  },
})
export default class ViewerPage implements OnDestroy {
  /**
   * konva comes with the viewer, never with the rest of the app. Its download starts as the page opens,
   * alongside the image record, rather than after it (the first tiles show about 0.4 s sooner).
   */
  private readonly drawingModules = Promise.all([import('konva'), import('./micrograph-stage'), import('./viewer-interaction')]);

  private readonly api = inject(ViewerApi);
  private readonly session = inject(SessionStore);
  private readonly title = inject(Title);
  protected readonly store = inject(AnnotationStore);
  protected readonly pins = inject(ReviewPinBoard);

  /** Route parameters. */
  readonly projectId = input.required<string>();
  readonly imageId = input.required<string>();
  /** Query parameter: a comment thread to show and fly to (notification e-mails link with it). */
  readonly thread = input<string | undefined>();
  private readonly canvasHost = viewChild<ElementRef<HTMLDivElement>>('canvasHost');
  private readonly stageHost = viewChild<ElementRef<HTMLDivElement>>('stageHost');
  private readonly noteCard = viewChild(NoteCard);
  private readonly compareHost = viewChild<ElementRef<HTMLDivElement>>('compareHost');
  private readonly compareStageHost = viewChild<ElementRef<HTMLDivElement>>('compareStageHost');

  protected readonly project = remote(this.projectId, (id) => this.api.project(id));
  protected readonly record = remote(
    () => ({ projectId: this.projectId(), imageId: this.imageId() }),
    (p) => this.api.image(p.projectId, p.imageId),
  );
  protected readonly classList = remote(this.projectId, (id) => this.api.classes(id));

  protected readonly image = computed(() => this.record.value() ?? null);
  protected readonly ready = computed(() => this.image()?.processing.state === 'ready');
  protected readonly allowed = computed(() => new Set(this.project.value()?.allowed ?? []));
  protected readonly canAnnotate = computed(() => this.allowed().has('annotate'));
  protected readonly canCalibrate = computed(() => this.allowed().has('editMetadata'));
  protected readonly canEditClasses = computed(() => this.allowed().has('editProject'));
  protected readonly canComment = computed(() => this.allowed().has('comment'));
  private readonly rights = computed<ToolRights>(() => ({ annotate: this.canAnnotate(), calibrate: this.canCalibrate(), comment: this.canComment() }));
  protected readonly members = computed<Mentionable[]>(() =>
    (this.project.value()?.members ?? []).map((m) => ({ id: m.userId, name: m.displayName, email: m.email })),
  );
  protected readonly classes = computed(() => this.classList.value() ?? []);
  protected readonly classId = linkedSignal<string>(() => this.classes()[0]?.id ?? '');
  protected readonly chosenClass = computed(() => this.classes().find((c) => c.id === this.classId()) ?? null);
  protected readonly kinds = computed<readonly AnnotationKind[]>(() => {
    const c = this.chosenClass();
    return c ? KINDS_FOR_SHAPE[c.shapeKind] : [];
  });
  protected readonly umPerPx = computed(() => this.image()?.pixelSize.xUm ?? null);
  protected readonly pixelSizeChip = computed(() => {
    const um = this.umPerPx();
    return um ? formatPixelSize(um) : '';
  });

  protected readonly tool = signal<ViewerTool>('select');
  protected readonly toolHint = computed(() => TOOL_HINTS[this.tool()]);
  protected readonly selectedKey = signal<string | null>(null);
  protected readonly hiddenClasses = signal<ReadonlySet<string>>(new Set());
  protected readonly view = signal<Viewport | null>(null);
  protected readonly cursor = signal<Point | null>(null);
  protected readonly readout = computed(() => {
    const p = this.cursor();
    return p ? cursorReadout(p, this.umPerPx()) : null;
  });
  protected readonly zoomPercent = computed(() => Math.round((this.view()?.scale ?? 0) * 100));
  protected readonly tone = signal<Tone>(NEUTRAL_TONE);
  protected readonly toneCurve = computed(() => toneTransfer(this.tone()));
  protected readonly helpOpen = signal(false);
  protected readonly calibrationLine = signal<Coordinates | null>(null);
  /** Where a note was just placed, waiting for its text. */
  protected readonly notePin = signal<{ at: Point } | null>(null);
  protected readonly pinCardPosition = computed(() => {
    const a = this.pins.draft();
    const v = this.view();
    return a && v ? cardNear(v, a) : null;
  });
  /** The side panel's tab: 0 annotations, 1 comments, 2 image, 3 display. */
  protected readonly sideTab = signal(0);
  protected readonly notePosition = computed(() => {
    const n = this.notePin();
    const v = this.view();
    return n && v ? imageToScreen(v, n.at[0], n.at[1]) : null;
  });
  /** A shape the client or the server refused, or a save conflict. */
  protected readonly problem = signal('');
  protected readonly saveLine = computed(() => {
    const s = this.store.saveStatus();
    if (s.waiting === 0) return '';
    if (s.retrying) return `${s.waiting} ${s.waiting === 1 ? 'change' : 'changes'} waiting to save`;
    return 'Saving…';
  });
  protected readonly previewSrc = computed(() => previewUrl(this.projectId(), this.imageId()));
  protected readonly backLink = computed(() => ['/projects', this.projectId(), 'images', this.imageId()]);

  /** A co-located image shown beside this one, with pan and zoom linked. */
  protected readonly compared = signal<ImageSummary | null>(null);
  protected readonly linkNote = computed(() => {
    const a = this.image();
    const b = this.compared();
    if (!a || !b) return '';
    if (this.compareAligned()) return 'Linked by the saved alignment';
    return linkedByMicrometres(frameOf(a), frameOf(b)) ? 'Linked by position in µm' : 'Linked by image fraction (one of the two is uncalibrated)';
  });

  /** The compared pane's view, for its scale bar. */
  protected readonly compareView = signal<Viewport | null>(null);
  /** The compared pane once its stage is up, for the alignment card. */
  protected readonly comparePaneRef = signal<ComparePane | null>(null);
  /** Whether the compared image has a saved alignment with this one (the alignment card says). */
  protected readonly compareAligned = signal(false);

  private stage: MicrographStage | null = null;
  private modules: StageModules | null = null;
  private comparePane: ComparePane | null = null;
  private interaction: ViewerInteraction | null = null;
  private resizeObserver: ResizeObserver | null = null;
  /** The stage is up and its first tiles are drawn (the side panels, shapes and pins wait for it). */
  protected readonly stageReady = signal(false);
  private mounting = false;
  private editing: { key: string; points: Coordinates } | null = null;
  private draft: ShapeDraft | null = null;
  private stopFlight: () => void = () => undefined;
  private classJustChosen = false;

  private readonly nameInTitle = effect(() => {
    const img = this.image();
    if (img) this.title.setTitle(`${img.originalName} · Viewer · Etchfile`);
  });

  private readonly mountWhenReady = effect(() => {
    const img = this.image();
    const host = this.canvasHost()?.nativeElement;
    const stageHost = this.stageHost()?.nativeElement;
    if (img && this.ready() && host && stageHost && !this.stage && !this.mounting) void this.mountStage(img, host, stageHost);
  });

  /** Who draws here, as plain values: a refreshed session object must not reopen the store. */
  private readonly meId = computed(() => this.session.user()?.id ?? '');
  private readonly meName = computed(() => this.session.user()?.displayName ?? '');

  private readonly openAnnotations = effect(() => {
    const id = this.meId();
    const name = this.meName();
    const projectId = this.projectId();
    const imageId = this.imageId();
    if (id && this.ready()) untracked(() => void this.store.open(projectId, imageId, { id, name }));
  });

  private readonly drawShapes = effect(() => {
    const shapes = this.store.shapes();
    const hidden = this.hiddenClasses();
    const colours = this.colourById();
    const um = this.umPerPx();
    if (!this.stageReady() || !this.stage) return;
    this.stage.shapes.setCalibration(um);
    untracked(() => {
      this.syncShapes(shapes, hidden, colours);
      this.refreshOverlay();
    });
  });

  private readonly loadPins = effect(() => {
    const projectId = this.projectId();
    const imageId = this.imageId();
    if (this.ready()) untracked(() => this.pins.show(projectId, imageId));
  });

  private readonly drawPins = effect(() => {
    const pins = this.pins.pins();
    const focused = this.pins.focused();
    if (!this.stageReady() || !this.stage) return;
    this.stage.overlay.setPins(pins, focused);
    this.stage.invalidate('overlay');
  });

  /** A link to a thread (?thread=…) opens the Comments tab and flies to its pin once both are there. */
  private flownToThread: string | null = null;
  private readonly followThreadLink = effect(() => {
    const id = this.thread();
    const pin = this.pins.pins().find((p) => p.threadId === id);
    const known = (this.pins.threads.value() ?? []).some((t) => t.id === id);
    if (!id || id === this.flownToThread || !known || !this.stageReady()) return;
    this.flownToThread = id;
    untracked(() => {
      this.pins.focused.set(id);
      this.sideTab.set(1);
      if (pin) this.flyToPin(id);
    });
  });

  private readonly drawSelection = effect(() => {
    this.selectedKey();
    this.tool();
    this.calibrationLine();
    if (this.stageReady()) untracked(() => this.refreshOverlay());
  });

  private readonly applyTone = effect(() => {
    const tone = this.tone();
    if (!this.stageReady() || !this.stage) return;
    const filter = isNeutralTone(tone) ? '' : 'url(#ef-viewer-tone)';
    this.stage.tileCanvas.style.filter = filter;
    this.comparePane?.setFilter(filter);
  });

  /** A tool the chosen class (or a changed right) no longer allows falls back to selecting. */
  private readonly keepToolFitting = effect(() => {
    const tool = this.tool();
    if (this.project.value() && !mayPickTool(tool, this.rights(), this.kinds())) this.tool.set('select');
  });

  private readonly dropDraftOnToolChange = effect(() => {
    this.tool();
    untracked(() => {
      this.interaction?.toolChanged();
      this.notePin.set(null);
    });
  });

  private readonly showCompared = effect(() => {
    const other = this.compared();
    const host = this.compareHost()?.nativeElement;
    const stageHost = this.compareStageHost()?.nativeElement;
    const ready = this.stageReady();
    untracked(() => {
      if (this.comparePane && this.comparePane.image.id !== other?.id) this.closeComparePane();
      if (other && host && stageHost && ready && !this.comparePane) this.openComparePane(other, host, stageHost);
    });
  });

  private readonly colourById = computed(() => new Map(this.classes().map((c) => [c.id, ANNOTATION_COLOURS[c.colour]])));

  ngOnDestroy(): void {
    this.stopFlight();
    this.resizeObserver?.disconnect();
    this.interaction?.destroy();
    this.stage?.destroy();
    this.closeComparePane();
  }

  protected colourOf(colour: AnnotationColour): string {
    return ANNOTATION_COLOURS[colour];
  }

  protected chooseClass(classId: string): void {
    this.classId.set(classId);
    this.classJustChosen = true;
  }

  /** After a class is picked, the keyboard goes back to the canvas so tool keys work at once. */
  protected returnToCanvas(): void {
    if (!this.classJustChosen) return;
    this.classJustChosen = false;
    setTimeout(() => this.canvasHost()?.nativeElement.focus({ preventScroll: true }));
  }

  protected fit(): void {
    const v = this.view();
    const img = this.image();
    if (v && img) this.setView(fitViewport(img, v.width, v.height));
  }

  protected showActualPixels(): void {
    const v = this.view();
    if (v) this.setView(actualPixels(v));
  }

  protected zoomBy(factor: number): void {
    const v = this.view();
    const img = this.image();
    if (v && img) this.setView(zoomAround(v, img, factor, v.width / 2, v.height / 2));
  }

  protected moveTo(p: { x: number; y: number }): void {
    const v = this.view();
    if (v) this.setView(centreOn(v, p.x, p.y));
  }

  /** From the side list: select the shape and fly the view to it. */
  protected chooseShape(key: string): void {
    const s = this.store.byKey().get(key);
    const v = this.view();
    if (!s || !v) return;
    this.selectedKey.set(key);
    this.tool.set('select');
    this.glideTo(viewportForBounds(v, s.bounds));
  }

  /** From the pin list or the canvas: focus the thread and fly the view to its pin. */
  protected flyToPin(threadId: string): void {
    const pin = this.pins.pins().find((p) => p.threadId === threadId);
    const v = this.view();
    const img = this.image();
    this.pins.focused.set(threadId);
    if (!pin || !v || !img) return;
    this.glideTo(viewportForBounds(v, pinFrame(pin, img)));
  }

  protected pinStarted(threadId: string): void {
    this.pins.draft.set(null);
    this.pins.focused.set(threadId);
    this.sideTab.set(1);
  }

  protected changeShape(change: { key: string; state: ShapeState }): void {
    this.store.update(change.key, change.state);
  }

  protected removeShape(key: string): void {
    this.store.remove(key);
    if (this.selectedKey() === key) this.selectedKey.set(null);
  }

  protected reloadFromPanel(what: 'classes' | 'annotations'): void {
    if (what === 'classes') this.classList.reload();
    else void this.store.reloadAll();
  }

  protected compareWith(other: ImageSummary): void {
    this.compared.set(other);
  }

  protected closeComparison(): void {
    this.compared.set(null);
  }

  protected calibrated(record: ImageRecord): void {
    this.record.set(record);
    this.calibrationLine.set(null);
    this.tool.set('select');
  }

  protected cancelCalibration(): void {
    this.calibrationLine.set(null);
  }

  protected saveNote(text: string): void {
    const n = this.notePin();
    if (!n || !this.image()) return;
    this.addShape({ classId: this.classId(), kind: 'text', points: [[n.at[0], n.at[1]]], label: text });
    if (!this.problem()) this.notePin.set(null);
  }

  protected undo(): void {
    const key = this.store.undo();
    if (key && !this.store.byKey().has(key) && this.selectedKey() === key) this.selectedKey.set(null);
  }

  protected redo(): void {
    const key = this.store.redo();
    if (key && !this.store.byKey().has(key) && this.selectedKey() === key) this.selectedKey.set(null);
  }

  protected deleteSelected(): void {
    const key = this.selectedKey();
    if (key && this.canAnnotate()) this.removeShape(key);
  }

  protected handleKeyDown(e: KeyboardEvent): void {
    if (!this.stage || isTypingTarget(e.target) || document.querySelector('.mat-mdc-dialog-container')) return;
    if (e.key === ' ' && !(e.target instanceof HTMLButtonElement)) {
      this.interaction?.setSpaceHeld(true);
      e.preventDefault();
      return;
    }
    const action = actionForKey(e);
    if (!action) return;
    if ((e.key === 'Enter' || e.key === ' ') && e.target instanceof HTMLButtonElement) return;
    e.preventDefault();
    this.run(action);
  }

  protected handleKeyUp(e: KeyboardEvent): void {
    if (e.key === ' ') this.interaction?.setSpaceHeld(false);
  }

  private run(a: ShortcutAction): void {
    switch (a.type) {
      case 'tool':
        return this.chooseTool(a.tool);
      case 'zoomIn':
        return this.zoomBy(ZOOM_STEP);
      case 'zoomOut':
        return this.zoomBy(1 / ZOOM_STEP);
      case 'fit':
        return this.fit();
      case 'actualPixels':
        return this.showActualPixels();
      case 'pan': {
        const v = this.view();
        if (v) this.setView(panBy(v, a.dx, a.dy));
        return;
      }
      case 'undo':
        return this.undo();
      case 'redo':
        return this.redo();
      case 'delete':
        return this.deleteSelected();
      case 'finish':
        if (this.noteCard()) return this.noteCard()!.add();
        return this.interaction?.finishDraft();
      case 'removeLast':
        this.interaction?.removeLastPoint();
        return;
      case 'cancel':
        if (this.interaction?.cancelDraft()) return;
        if (this.helpOpen()) return this.helpOpen.set(false);
        if (this.notePin()) return this.notePin.set(null);
        if (this.pins.draft()) return this.pins.draft.set(null);
        if (this.calibrationLine()) return this.calibrationLine.set(null);
        return this.selectedKey.set(null);
      case 'help':
        return this.helpOpen.update((open) => !open);
    }
  }

  private chooseTool(tool: ViewerTool): void {
    if (mayPickTool(tool, this.rights(), this.kinds())) this.tool.set(tool);
  }

  /** Glides to `target`; if the canvas changes size on the way, each step keeps its centre at the new size. */
  private glideTo(target: Viewport): void {
    const from = this.view();
    if (!from) return;
    this.stopFlight();
    this.stopFlight = fly(from, target, (next) => {
      const now = this.view();
      this.setView(now && (now.width !== next.width || now.height !== next.height) ? resizeViewport(next, now.width, now.height) : next);
    });
  }

  private setView(v: Viewport): void {
    const img = this.image();
    const next = img ? keepInView(v, img) : v;
    this.view.set(next);
    this.stage?.setViewport(next);
    this.comparePane?.follow(next);
  }

  private openComparePane(other: ImageSummary, host: HTMLDivElement, stageHost: HTMLDivElement): void {
    const a = this.image();
    if (!this.modules || !a || !this.view()) return;
    const projectId = this.projectId();
    this.comparePane = new ComparePane(
      this.modules,
      host,
      stageHost,
      other,
      { image: a, stageEl: this.stageHost()!.nativeElement, tileCanvas: this.stage!.tileCanvas, view: () => this.view(), setView: (v) => this.setView(v), viewChanged: (v) => this.compareView.set(v) },
      { tile: (level, col, row) => tileUrl(projectId, other.id, level, col, row), preview: previewUrl(projectId, other.id) },
    );
    if (!isNeutralTone(this.tone())) this.comparePane.setFilter('url(#ef-viewer-tone)');
    this.comparePaneRef.set(this.comparePane);
  }

  private closeComparePane(): void {
    this.comparePane?.destroy();
    this.comparePane = null;
    this.comparePaneRef.set(null);
    this.compareView.set(null);
  }

  private async mountStage(img: ImageRecord, host: HTMLDivElement, stageHost: HTMLDivElement): Promise<void> {
    this.mounting = true;
    const [{ default: Konva }, { MicrographStage }, { ViewerInteraction }] = await this.drawingModules;
    this.modules = { Konva, MicrographStage, ViewerInteraction };
    const width = Math.max(1, host.clientWidth);
    const height = Math.max(1, host.clientHeight);
    const v = fitViewport(img, width, height);
    const projectId = this.projectId();
    this.stage = new MicrographStage(Konva, stageHost, img, v, {
      tile: (level, col, row) => tileUrl(projectId, img.id, level, col, row),
      preview: previewUrl(projectId, img.id),
    });
    this.interaction = new ViewerInteraction(stageHost, host, {
      image: img,
      view: () => this.view() ?? v,
      setView: (next) => this.setView(next),
      tool: () => this.tool(),
      canEdit: () => this.canAnnotate(),
      shapes: () => {
        const hidden = this.hiddenClasses();
        return this.store.shapes().filter((s) => isShown(s, hidden));
      },
      selected: () => this.selectedKey(),
      select: (key) => this.selectedKey.set(key),
      draftChanged: (d) => {
        this.draft = d;
        this.refreshOverlay();
      },
      finished: (result) => this.finished(result),
      editPreview: (key, points) => this.editPreview(key, points),
      commitEdit: (key, points) => this.commitEdit(key, points),
      editRefused: (reason) => this.problem.set(reason),
      pressPin: (p, unit) => this.pressPin(p, unit),
      cursorMoved: (p) => this.cursor.set(p),
    });
    this.resizeObserver = new ResizeObserver(() => {
      const current = this.view();
      const w = Math.max(1, host.clientWidth);
      const h = Math.max(1, host.clientHeight);
      if (current && (current.width !== w || current.height !== h)) this.setView(resizeViewport(current, w, h));
    });
    this.resizeObserver.observe(host);
    this.view.set(v);
    // The side panels and shapes wait until the first tiles are drawn (or a second has passed): their
    // layout would otherwise hold back the frame that shows the micrograph.
    const stage = this.stage;
    void Promise.race([stage.tiles.firstDrawn, new Promise((r) => setTimeout(r, FIRST_TILES_WAIT_MS))]).then(() =>
      requestAnimationFrame(() => {
        if (this.stage === stage) this.stageReady.set(true);
      }),
    );
  }

  private finished(result: FinishedDraft): void {
    this.problem.set('');
    if (result.tool === 'calibrate') {
      this.calibrationLine.set(result.points);
      return;
    }
    if (result.tool === 'pin') {
      this.pins.draft.set(anchorFromDraft(result.points));
      return;
    }
    if (result.tool === 'text') {
      this.notePin.set({ at: result.points[0]! });
      return;
    }
    this.addShape({ classId: this.classId(), kind: KIND_OF_TOOL[result.tool]!, points: result.points, label: '' });
  }

  /** A press of the select tool on a comment pin shows its thread in the side panel. */
  private pressPin(p: Point, unit: number): boolean {
    const hit = this.pins.focusAt(p, unit);
    if (hit) this.sideTab.set(1);
    return hit;
  }

  /** Checks a new shape as the server will, then shows and saves it. */
  private addShape(state: ShapeState): void {
    const img = this.image();
    if (!img || !this.canAnnotate()) return;
    if (!state.classId) return this.problem.set('Choose a class before drawing.');
    const problem = shapeProblem(state.kind, state.points, img, state.label);
    if (problem) return this.problem.set(problem);
    this.problem.set('');
    this.store.add(state);
  }

  private editPreview(key: string, points: Coordinates | null): void {
    const was = this.editing?.key ?? null;
    this.editing = points ? { key, points } : null;
    // The dragged shape leaves the shape layer while the overlay shows it moving.
    if (was !== (this.editing?.key ?? null)) this.syncShapes(this.store.shapes(), this.hiddenClasses(), this.colourById());
    this.refreshOverlay();
  }

  private commitEdit(key: string, points: Coordinates): void {
    const s = this.store.byKey().get(key);
    const img = this.image();
    if (!s || !img) return;
    const problem = shapeProblem(s.kind, points, img, s.label);
    if (problem) {
      this.problem.set(problem);
      return this.refreshOverlay();
    }
    this.problem.set('');
    this.store.update(key, { classId: s.classId, kind: s.kind, points, label: s.label });
  }

  private syncShapes(shapes: readonly ViewShape[], hidden: ReadonlySet<string>, colours: Map<string, string>): void {
    if (!this.stage) return;
    this.stage.shapes.sync(shapes, (s) => colours.get(s.classId) ?? ANNOTATION_COLOURS.slate, (s) => isShown(s, hidden), this.editing?.key ?? null);
    this.stage.invalidate('shapes');
  }

  /** Selection, draft and calibration line onto the overlay layer. */
  private refreshOverlay(): void {
    const stage = this.stage;
    if (!stage) return;
    const um = this.umPerPx();
    const colourOf = (classId: string) => this.colourById().get(classId) ?? ANNOTATION_COLOURS.slate;
    const key = this.selectedKey();
    const selected = key ? this.store.byKey().get(key) : undefined;
    const edited = this.editing && this.editing.key === key ? this.editing.points : null;
    stage.overlay.setSelection(selectionOverlay(selected, edited, selected ? colourOf(selected.classId) : '', um), this.canAnnotate() && this.tool() === 'select');
    stage.overlay.setCalibrationLine(this.calibrationLine());
    stage.overlay.setDraft(draftOverlay(this.draft, colourOf(this.classId()), um));
    stage.invalidate('overlay');
  }
}
