import { computed, signal, type Signal } from '@angular/core';
import type { Annotation, AnnotationClass } from '../../../shared/annotations/annotations';
import type { Point } from '../../../shared/annotations/geometry';
import { bandFrame } from './measure-draft';
import { insidePlace, parseBinEdges, regionChoices, subBandEdgeLines, whereOfPlace, type PlaceValue } from './measure-where';

/**
 * Where the measuring page measures: the place chosen (whole image, a layer band, an outlined region), the
 * bands and outlines the image offers, and the sub-band edges typed in. Signals only; the maths is in
 * measure-where.ts and measure-draft.ts.
 */
export class MeasurePlace {
  /** 'image', 'band:n' or 'region:<outline id>'. */
  readonly place = signal<PlaceValue>('image');
  /** Sub-band edges as typed, e.g. "0, 20, 40, 60" (µm from the nearest bond interface). */
  readonly binsText = signal('');

  readonly where = computed(() => whereOfPlace(this.place()));
  readonly band = computed(() => {
    const w = this.where();
    return w.type === 'band' ? w.band : 0;
  });
  readonly regionId = computed(() => {
    const w = this.where();
    return w.type === 'region' ? w.annotationId : null;
  });
  readonly bands = computed(() => {
    const f = this.shapes();
    return f ? bandFrame(f.shapes, f.classes) : { interfaces: [], axis: 'x' as const, bands: [] };
  });
  readonly interfacePaths = computed(() => this.bands().interfaces.map((line) => line.map((p) => p.join(',')).join(' ')));
  readonly regions = computed(() => {
    const f = this.shapes();
    return f ? regionChoices(f.shapes, f.classes) : [];
  });
  readonly regionOutline = computed(() => this.regions().find((r) => r.id === this.regionId())?.ring.map((p) => p.join(',')).join(' ') ?? null);
  readonly bins = computed(() => parseBinEdges(this.binsText()));
  /** Sub-bands need bond interfaces to measure from, and apply to intercept counts. */
  readonly binsOffered = computed(() => this.countsIntercepts() && this.bands().interfaces.length > 0);
  /** The sub-band edges drawn on the image, dashed, within the chosen place. */
  readonly subBandLines = computed(() => {
    const edges = this.bins().edges;
    const um = this.umPerPx();
    if (!edges || !um || !this.binsOffered()) return [];
    return subBandEdgeLines(this.bands(), edges, um, this.inside).map((l) => ({ edgeUm: l.edgeUm, points: l.points.map((p) => p.join(',')).join(' '), at: l.points[Math.floor(l.points.length / 2)]! }));
  });

  constructor(
    private readonly shapes: Signal<{ shapes: Annotation[]; classes: AnnotationClass[] } | undefined>,
    private readonly countsIntercepts: Signal<boolean>,
    private readonly umPerPx: Signal<number | null>,
  ) {}

  /** Whether an image point lies where the measurement applies. */
  readonly inside = (p: Point): boolean => insidePlace(this.where(), this.bands(), this.regions(), p);
}
