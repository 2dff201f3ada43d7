import { ChangeDetectionStrategy, Component, computed, effect, inject, input, linkedSignal, signal, untracked } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { Title } from '@angular/platform-browser';
import { RouterLink } from '@angular/router';
import { forkJoin } from 'rxjs';
import type { Point } from '../../../shared/annotations/geometry';
import { defaultDetector, type CrossingDetector } from '../../../shared/measurements/crossings';
import type { CountRules, MarkKind } from '../../../shared/measurements/e112';
import type { Measurement, MeasurementHistoryEntry } from '../../../shared/measurements/measurement-records';
import type { PointMark } from '../../../shared/measurements/measurements';
import { patternLines } from '../../../shared/measurements/patterns';
import { gridPoints } from '../../../shared/measurements/point-count';
import { apiErrorMessage } from '../core/api-error-message';
import { askToConfirm } from '../core/confirm-dialog';
import { remote } from '../core/remote';
import { Breadcrumbs, type Crumb } from '../archive/breadcrumbs';
import { ImageApi } from '../archive/image-api';
import { ProjectApi } from '../projects/project-api';
import { defaultRules, liveCounts, MARK_KIND_LABELS, markKindsFor, type DraftMark } from './mark-counts';
import { bodyOf, DEFAULT_PATTERN, formOf, patternOf, type PatternForm } from './measure-draft';
import { detectorHint } from './measure-units';
import { countedPieces, countsPerSubBand, placeValue, pointCountChoices } from './measure-where';
import { MeasurePhase } from './measure-phase';
import { MeasurePlace } from './measure-place';
import { MeasurementsApi } from './measurements-api';
import { MeasureResult } from './measure-result';
import { SavedMeasurements } from './saved-measurements';
import { formatCount, formatDuration, formatUmPerPx } from './measure-units';
import { markNear, pathSegments, snapToSegments } from './test-line-snap';
import { markRadiusFor } from './mark-glyphs';
import { PatternMarks } from './pattern-marks';

type Kind = 'intercept' | 'point_count' | 'thickness';
/** How close (screen px) a click must land to a line, mark or grid point. */
const CLICK_REACH_PX = 10;

/** The measuring bench: lay a test pattern over a micrograph, mark boundary hits, save, reopen. */
@Component({
  selector: 'ef-measure-page',
  imports: [Breadcrumbs, MatButton, MatIcon, MatProgressBar, MeasureResult, PatternMarks, RouterLink, SavedMeasurements],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './measure-page.html',
  styleUrl: './measure-page.scss',
})
export default class MeasurePage {
  private readonly api = inject(MeasurementsApi);
  private readonly imageApi = inject(ImageApi);
  private readonly projectApi = inject(ProjectApi);
  private readonly dialog = inject(MatDialog);
  private readonly title = inject(Title);

  /** Route parameters. */
  readonly projectId = input.required<string>();
  readonly imageId = input.required<string>();
  /** Query parameter `?measurement=<id>`: a saved measurement to reopen once the list arrives (links from the summary). */
  readonly measurement = input<string>();

  private readonly ids = computed(() => ({ projectId: this.projectId(), imageId: this.imageId() }));
  protected readonly project = remote(this.projectId, (id) => this.projectApi.get(id));
  protected readonly image = remote(this.ids, ({ projectId, imageId }) => this.imageApi.get(projectId, imageId));
  protected readonly frame = remote(this.ids, ({ projectId, imageId }) =>
    forkJoin({ shapes: this.api.annotations(projectId, imageId), classes: this.api.annotationClasses(projectId) }),
  );
  protected readonly saved = remote(this.ids, ({ projectId, imageId }) => this.api.list(projectId, imageId));

  protected readonly kind = signal<Kind>('intercept');
  protected readonly form = signal<PatternForm>(DEFAULT_PATTERN);
  /** Where to measure: whole image, layer band or outlined region, and the sub-band edges. */
  protected readonly at = new MeasurePlace(this.frame.value, computed(() => this.kind() === 'intercept'), computed(() => this.layUmPerPx()));
  /** Two-phase: intercepts of one phase divided by its volume fraction. */
  protected readonly grainsPhase = new MeasurePhase();
  protected readonly rules = signal<CountRules>(defaultRules('lines'));
  protected readonly markKind = signal<MarkKind>('crossing');
  protected readonly marks = signal<DraftMark[]>([]);
  protected readonly pointMarks = signal<PointMark[]>([]);
  protected readonly gridSpacingUm = signal(25);
  protected readonly phaseName = signal('oxide');
  protected readonly thicknessSpacingUm = signal(10);
  protected readonly selectedSuggestion = signal(-1);
  protected readonly suggesting = signal(false);
  protected readonly suggestNote = signal('');
  protected readonly saving = signal(false);
  protected readonly errorText = signal('');
  protected readonly fieldErrors = signal<Record<string, string>>({});
  /** The measurement reopened for editing (PATCH with its version), or null for a new one. */
  protected readonly editing = signal<Measurement | null>(null);
  protected readonly result = signal<Measurement | null>(null);
  /** Earlier results of the reopened measurement (loaded with it). */
  protected readonly history = signal<MeasurementHistoryEntry[]>([]);
  /** Set once the pattern or where of a reopened measurement changes: the server then lays the pattern anew. */
  protected readonly patternDirty = signal(false);

  protected readonly markKindLabels = MARK_KIND_LABELS;
  protected readonly canMeasure = computed(() => this.project.value()?.allowed.includes('measure') ?? false);
  protected readonly umPerPx = computed(() => this.image.value()?.pixelSize.xUm ?? null);
  protected readonly calibrated = computed(() => this.umPerPx() !== null);
  protected readonly calibrationText = computed(() => formatUmPerPx(this.umPerPx()));
  protected readonly size = computed(() => ({ w: this.image.value()?.width ?? 1, h: this.image.value()?.height ?? 1 }));
  protected readonly viewBox = computed(() => `0 0 ${this.size().w} ${this.size().h}`);
  protected readonly previewUrl = computed(() => this.imageApi.previewUrl(this.projectId(), this.imageId()));
  protected readonly viewerLink = computed(() => ['/projects', this.projectId(), 'images', this.imageId(), 'view']);
  protected readonly pointCounts = computed(() => pointCountChoices(this.saved.value() ?? [], this.at.where()));
  /** The crossing finder: chosen by the person, defaulting to what fits how the image was made. */
  protected readonly detector = linkedSignal<CrossingDetector>(() => defaultDetector(this.image.value()?.modality ?? '') ?? 'valleys');
  protected readonly detectorHint = computed(() => detectorHint(this.image.value()?.modality ?? null, this.detector()));
  /** A reopened measurement keeps the pixel size it was computed at (the server lays its pattern at that size). */
  protected readonly layUmPerPx = computed(() => this.editing()?.pixelSize.umPerPx ?? this.umPerPx());
  protected readonly pattern = computed(() => patternOf(this.form(), this.size().w, this.size().h, this.layUmPerPx() ?? 1));
  /** The lines as the server laid and counted them, while a reopened pattern is unchanged (marks were placed on them). */
  protected readonly storedPaths = computed(() => {
    const e = this.editing();
    return e && e.kind === 'intercept' && !this.patternDirty() ? e.testLines : null;
  });
  protected readonly testLines = computed(() =>
    this.calibrated() && this.kind() === 'intercept' && !this.storedPaths() ? patternLines(this.pattern(), this.size().w, this.size().h, this.layUmPerPx()!) : [],
  );
  private readonly snapSegments = computed(() => {
    const stored = this.storedPaths();
    return stored ? pathSegments(stored) : this.testLines().map((seg, line) => ({ line, seg }));
  });
  protected readonly lineCount = computed(() => this.storedPaths()?.length ?? this.testLines().length);
  protected readonly segments = computed(() => this.testLines().map((l, i) => ({ i, l })).filter((x) => x.l.kind === 'segment'));
  /** With a band chosen, the parts of the straight lines that count are drawn bright over the faint full lines. */
  protected readonly countedPieces = computed(() => countedPieces(this.testLines(), this.at.where(), this.at.bands(), this.at.regions()));
  protected readonly circles = computed(() => this.testLines().map((l, i) => ({ i, l })).filter((x) => x.l.kind === 'circle'));
  protected readonly grid = computed(() => {
    const um = this.umPerPx();
    if (!um || this.kind() !== 'point_count' || !(this.gridSpacingUm() > 0)) return [];
    const pts = gridPoints(this.size().w, this.size().h, this.gridSpacingUm() / (this.layUmPerPx() ?? um));
    return pts.length > 5000 ? [] : pts.filter((p) => this.at.inside(p));
  });
  protected readonly markKinds = computed(() => markKindsFor(this.form().type, this.rules()));
  protected readonly counts = computed(() => liveCounts(this.marks(), this.lineCount(), this.rules()));
  protected readonly countSymbol = computed(() => (this.rules().count === 'intercepts' ? 'N' : 'P'));
  /** Live counts per sub-band, when sub-band edges are set. */
  protected readonly perSubBand = computed(() => {
    const edges = this.at.bins().edges;
    const um = this.layUmPerPx();
    if (!edges || !um || !this.at.binsOffered()) return [];
    return countsPerSubBand(this.marks(), this.at.bands().interfaces, edges, um, this.rules()).map((b) => ({ ...b, text: formatCount(b.count) }));
  });
  protected readonly perLine = computed(() => this.counts().perLine.map((v, i) => ({ line: i, text: formatCount(v) })));
  protected readonly totalText = computed(() => formatCount(this.counts().total));
  protected readonly pointTally = computed(() => {
    const m = this.pointMarks().filter((p) => p.status === 'confirmed');
    const inside = m.filter((p) => p.hit === 'inside').length;
    const boundary = m.filter((p) => p.hit === 'boundary').length;
    const total = this.grid().length;
    return { inside, boundary, total, fraction: total > 0 ? (inside + boundary / 2) / total : null };
  });
  protected readonly markRadius = computed(() => markRadiusFor(this.size().w));
  protected readonly crumbs = computed<Crumb[]>(() => {
    const i = this.image.value();
    const p = this.projectId();
    return [
      { label: 'Projects', link: ['/projects'] },
      { label: this.project.value()?.code ?? 'Project', link: ['/projects', p] },
      ...(i ? [{ label: i.specimenCode, link: ['/projects', p, 'specimens', i.specimenId] }, { label: i.originalName, link: ['/projects', p, 'images', i.id] }] : []),
      { label: 'Measure' },
    ];
  });
  protected readonly uncalibratedRefusal = computed(() => !this.calibrated() || /calibrat/i.test(this.errorText()));

  private readonly pageTitle = effect(() => {
    const i = this.image.value();
    if (i) this.title.setTitle(`Measure ${i.originalName} · Etchfile`);
  });
  /** The measurement a link asked for, reopened once (later reloads of the list leave the bench alone). */
  private readonly linkedOpened = signal<string | null>(null);
  private readonly openLinked = effect(() => {
    const id = this.measurement();
    const found = id ? this.saved.value()?.find((m) => m.id === id) : undefined;
    if (!found || untracked(this.linkedOpened) === found.id) return;
    untracked(() => {
      this.linkedOpened.set(found.id);
      this.reopen(found);
    });
  });

  protected chooseKind(kind: string): void {
    this.kind.set(kind as Kind);
    if (kind === 'thickness' && this.at.band() === 0) this.at.place.set('band:1');
    this.clearResult();
  }

  /** A new pattern lays new lines: marks on the old ones no longer belong anywhere. */
  protected changePattern(change: Partial<PatternForm>): void {
    const before = this.form().type;
    this.form.update((f) => ({ ...f, ...change }));
    this.patternDirty.set(true);
    if (change.type && change.type !== before) this.rules.set(defaultRules(change.type));
    if (!this.markKinds().includes(this.markKind())) this.markKind.set('crossing');
    this.marks.set([]);
    this.selectedSuggestion.set(-1);
    this.suggestNote.set('');
    this.clearResult();
  }

  protected changePlace(value: string): void {
    this.at.place.set(value);
    this.patternDirty.set(true);
    this.grainsPhase.pointCountId.set('');
    this.marks.update((ms) => ms.filter((m) => this.at.inside([m.x, m.y])));
    this.pointMarks.set([]);
    this.clearResult();
  }

  protected changeRules(change: Partial<CountRules>): void {
    this.rules.update((r) => ({ ...r, ...change }));
    if (!this.markKinds().includes(this.markKind())) this.markKind.set('crossing');
  }

  /** A click on the overlay: remove a mark, pick a suggestion, move it, or add a mark snapped to a line. */
  protected clickOverlay(event: MouseEvent): void {
    const svg = event.currentTarget as SVGSVGElement;
    const box = svg.getBoundingClientRect();
    const scale = this.size().w / box.width;
    const p: Point = [(event.clientX - box.left) * scale, (event.clientY - box.top) * scale];
    const reach = CLICK_REACH_PX * scale;
    if (this.kind() === 'point_count') return this.clickGrid(p, reach);
    if (this.kind() !== 'intercept') return;
    const hit = markNear(p, this.marks(), reach);
    if (hit >= 0) {
      if (this.marks()[hit]!.status === 'suggested') this.selectedSuggestion.set(this.selectedSuggestion() === hit ? -1 : hit);
      else this.removeMark(hit);
      return;
    }
    const inside = (q: Point) => this.storedPaths() !== null || this.at.inside(q);
    const snapped = snapToSegments(p, this.snapSegments(), reach, inside);
    if (!snapped) return;
    const [x, y] = snapped.point;
    const moving = this.selectedSuggestion();
    if (moving >= 0) {
      // A suggestion moved by hand is the person's own mark from then on.
      this.marks.update((ms) => ms.map((m, i) => (i === moving ? { ...m, x, y, line: snapped.line, status: 'confirmed' } : m)));
      this.selectedSuggestion.set(-1);
      return;
    }
    const kind = this.form().type !== 'lines' && this.markKind() === 'line_end' ? 'crossing' : this.markKind();
    this.marks.update((ms) => [...ms, { x, y, line: snapped.line, kind, status: 'confirmed' }]);
  }

  protected removeMark(index: number): void {
    this.marks.update((ms) => ms.filter((_, i) => i !== index));
    this.selectedSuggestion.set(-1);
  }

  protected acceptMark(index: number): void {
    this.marks.update((ms) => ms.map((m, i) => (i === index ? { ...m, status: 'confirmed' } : m)));
    this.selectedSuggestion.set(-1);
  }

  protected acceptAll(): void {
    this.marks.update((ms) => ms.map((m) => ({ ...m, status: 'confirmed' })));
    this.selectedSuggestion.set(-1);
  }

  protected dropSuggestions(): void {
    this.marks.update((ms) => ms.filter((m) => m.status === 'confirmed'));
    this.selectedSuggestion.set(-1);
  }

  protected suggest(): void {
    this.suggesting.set(true);
    this.errorText.set('');
    const detector = this.detector();
    this.api.suggest(this.projectId(), this.imageId(), { pattern: this.pattern(), placement: { offsetPx: [0, 0] }, where: this.at.where(), detector }).subscribe({
      next: (answer) => {
        const proposed: DraftMark[] = answer.marks.map((m) => ({ x: m.x, y: m.y, line: m.line, kind: m.kind, status: 'suggested' }));
        this.marks.update((ms) => [...ms.filter((m) => m.status === 'confirmed'), ...proposed]);
        const how = answer.detector === 'valleys' ? 'dark boundary lines' : 'changes of colour or brightness';
        this.suggestNote.set(`${proposed.length} suggestions in ${formatDuration(answer.ms)} (looked for ${how}). Hollow marks do not count until you accept them.`);
        this.suggesting.set(false);
      },
      error: (error) => {
        this.errorText.set(apiErrorMessage(error).message);
        this.suggesting.set(false);
      },
    });
  }

  protected save(): void {
    const body = bodyOf({
      kind: this.kind(), pattern: this.pattern(), band: this.at.band(), rules: this.rules(), marks: this.marks(),
      gridSpacingUm: this.gridSpacingUm(), phaseName: this.phaseName(), pointMarks: this.pointMarks(),
      thicknessSpacingUm: this.thicknessSpacingUm(), note: '', regionId: this.at.regionId(),
      distanceBinsUm: this.at.binsOffered() ? this.at.bins().edges : null, phase: this.grainsPhase.body(),
    });
    if (this.at.binsOffered() && this.at.bins().error) {
      this.errorText.set(this.at.bins().error);
      return;
    }
    const open = this.editing();
    this.saving.set(true);
    this.errorText.set('');
    this.fieldErrors.set({});
    const { kind: _kind, ...all } = body;
    // An unchanged pattern stays laid where its marks were placed; sending it would lay it anew.
    const changes = this.patternDirty() ? all : omitLayout(all);
    const request = open && open.kind === body.kind
      ? this.api.update(this.projectId(), this.imageId(), open.id, { version: open.version, ...changes })
      : this.api.create(this.projectId(), this.imageId(), body);
    request.subscribe({
      next: (saved) => {
        this.result.set(saved);
        this.editing.set(saved);
        this.loadHistory(saved);
        this.patternDirty.set(false);
        this.saving.set(false);
        this.saved.reload();
      },
      error: (error) => {
        const problem = apiErrorMessage(error);
        const details = Object.values(problem.fieldErrors).filter((d) => !problem.message.includes(d));
        this.errorText.set(details.length > 0 ? `${problem.message} ${details.slice(0, 3).join(' ')}` : problem.message);
        this.fieldErrors.set(problem.fieldErrors);
        this.saving.set(false);
      },
    });
  }

  /** Shows a saved measurement again, marks and all, to look at or change. */
  protected reopen(m: Measurement): void {
    const d = m.definition;
    this.kind.set(d.kind);
    this.at.place.set(placeValue(d.where));
    if (d.kind === 'intercept') {
      this.at.binsText.set(d.distanceBinsUm?.join(', ') ?? '');
      this.grainsPhase.restore(d.phase);
      this.form.set(formOf(d.pattern));
      this.rules.set(d.rules ?? defaultRules(d.pattern.type));
      this.marks.set(d.marks.map((k) => ({ x: k.x, y: k.y, line: k.line, kind: k.kind, status: k.status })));
    } else if (d.kind === 'point_count') {
      this.gridSpacingUm.set(d.grid.spacingUm);
      this.phaseName.set(d.phaseName);
      this.pointMarks.set(d.marks);
    } else {
      this.thicknessSpacingUm.set(d.spacingUm);
    }
    this.editing.set(m);
    this.patternDirty.set(false);
    this.result.set(m);
    this.loadHistory(m);
    this.suggestNote.set('');
    this.errorText.set('');
  }

  protected startNew(): void {
    this.editing.set(null);
    this.patternDirty.set(false);
    this.marks.set([]);
    this.pointMarks.set([]);
    this.clearResult();
  }

  protected recompute(m: Measurement): void {
    this.api.recompute(this.projectId(), this.imageId(), m.id, m.version).subscribe({
      next: (fresh) => {
        if (this.editing()?.id === fresh.id) this.reopen(fresh);
        this.saved.reload();
      },
      error: (error) => this.errorText.set(apiErrorMessage(error).message),
    });
  }

  protected deleteMeasurement(m: Measurement): void {
    askToConfirm(this.dialog, {
      title: 'Delete this measurement?',
      message: `The measurement on ${m.whereLabel} is removed from the list and the summaries; its history is kept.`,
      confirmLabel: 'Delete',
    }).subscribe((yes) => {
      if (!yes) return;
      this.api.remove(this.projectId(), this.imageId(), m.id, m.version).subscribe({
        next: () => {
          if (this.editing()?.id === m.id) this.startNew();
          this.saved.reload();
        },
        error: (error) => this.errorText.set(apiErrorMessage(error).message),
      });
    });
  }

  /** Two-phase on or off: a two-phase count counts intercepts N of its phase (E112). */
  protected chooseTwoPhase(on: boolean): void {
    this.grainsPhase.on.set(on);
    if (on) this.rules.update((r) => ({ ...r, count: 'intercepts' }));
  }

  protected removePointMark(index: number): void {
    this.pointMarks.update((ms) => ms.filter((_, i) => i !== index));
  }

  /** A grid point cycles: not counted → inside → on the boundary → not counted. */
  private clickGrid(p: Point, reach: number): void {
    const at = markNear(p, this.grid().map(([x, y]) => ({ x, y })), reach);
    if (at < 0) return;
    const [x, y] = this.grid()[at]!;
    const existing = this.pointMarks().findIndex((m) => Math.hypot(m.x - x, m.y - y) < 0.5);
    if (existing < 0) this.pointMarks.update((ms) => [...ms, { x, y, hit: 'inside', status: 'confirmed' }]);
    else if (this.pointMarks()[existing]!.hit === 'inside') this.pointMarks.update((ms) => ms.map((m, i) => (i === existing ? { ...m, hit: 'boundary' } : m)));
    else this.removePointMark(existing);
  }

  /** The history is read with the measurement's detail; a failure leaves the list empty (the result itself is shown). */
  private loadHistory(m: Measurement): void {
    this.history.set([]);
    this.api.get(this.projectId(), this.imageId(), m.id).subscribe({
      next: (detail) => {
        if (this.editing()?.id === m.id) this.history.set(detail.history);
      },
      error: () => this.history.set([]),
    });
  }

  private clearResult(): void {
    this.result.set(null);
    this.history.set([]);
    this.errorText.set('');
    this.fieldErrors.set({});
  }
}

/** The definition without what lays the pattern (pattern, placement, grid, where), for a PATCH that keeps the stored layout. */
function omitLayout<T extends object>(body: T): Partial<T> {
  const { pattern: _p, placement: _o, grid: _g, where: _w, ...rest } = body as T & { pattern?: unknown; placement?: unknown; grid?: unknown; where?: unknown };
  return rest as Partial<T>;
}
