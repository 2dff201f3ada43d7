import { expect } from 'chai';
import type { Annotation, AnnotationClass } from '../../../../shared/annotations/annotations';
import { measurementBody } from '../../../../shared/measurements/measurements';
import type { PatternSpec } from '../../../../shared/measurements/patterns';
import type { DraftMark } from '../../../../src/app/measurements/mark-counts';
import {
  DEFAULT_PATTERN,
  bandFrame,
  bodyOf,
  formOf,
  insideWhere,
  patternOf,
  whereOf,
  type DraftDefinition,
  type PatternForm,
} from '../../../../src/app/measurements/measure-draft';

const cls = (id: string, name: string): AnnotationClass => ({ id, projectId: 'p1', name, colour: 'cobalt', shapeKind: 'line', usage: 0 });
const shape = (classId: string, kind: Annotation['kind'], points: [number, number][]): Annotation => ({
  id: `a-${Math.random()}`,
  imageId: 'img',
  classId,
  kind,
  points,
  label: '',
  authorId: 'u1',
  authorName: 'Ana',
  createdAt: '2026-01-01T00:00:00Z',
  updatedAt: '2026-01-01T00:00:00Z',
  version: 1,
});
const classes = [cls('c-bond', 'Bond interface'), cls('c-crack', 'Crack')];

describe('client: measure draft, the pattern from the form', () => {
  const form = (over: Partial<PatternForm>): PatternForm => ({ ...DEFAULT_PATTERN, ...over });

  it('sends circle diameters as typed', () => {
    expect(patternOf(form({ type: 'circle', diameterUm: 250 }), 2000, 1000, 0.5)).to.deep.equal({ type: 'circle', diameterUm: 250 });
    expect(patternOf(form({ type: 'three_circles', largestDiameterUm: 300 }), 2000, 1000, 0.5)).to.deep.equal({ type: 'three_circles', largestDiameterUm: 300 });
  });

  it('sends a typed line spacing as typed', () => {
    const body = patternOf(form({ spacingMode: 'um', spacingUm: 37.5, count: 4 }), 2000, 1000, 0.5);

    expect(body).to.deep.equal({ type: 'lines', direction: 'horizontal', spacingUm: 37.5, count: 4 });
  });

  it('spreads "about N" horizontal lines over the height and vertical ones over the width', () => {
    // Hand-computed: 1000 px / (9 + 1) × 0.5 µm/px = 50 µm; 2000 px / 10 × 0.5 = 100 µm.
    const across = patternOf(form({ spacingMode: 'reach', count: 9, direction: 'horizontal' }), 2000, 1000, 0.5);
    const down = patternOf(form({ spacingMode: 'reach', count: 9, direction: 'vertical' }), 2000, 1000, 0.5);

    expect(across).to.include({ spacingUm: 50, count: 9 });
    expect(down).to.include({ spacingUm: 100, count: 9 });
  });

  it('spreads lines laid both ways or at an angle over the shorter side', () => {
    // Hand-computed: min(2000, 1000) = 1000 px → 50 µm for 9 lines at 0.5 µm/px.
    expect(patternOf(form({ count: 9, direction: 'both' }), 2000, 1000, 0.5)).to.include({ spacingUm: 50 });
    expect(patternOf(form({ count: 9, direction: 'angle' }), 1000, 2000, 0.5)).to.include({ spacingUm: 50 });
  });

  it('sends the angle only for lines laid at an angle', () => {
    expect(patternOf(form({ direction: 'angle', angleDeg: 30 }), 1000, 1000, 1)).to.have.property('angleDeg', 30);
    expect(patternOf(form({ direction: 'both', angleDeg: 30 }), 1000, 1000, 1)).to.not.have.property('angleDeg');
  });

  it('reopens a saved pattern with its spacing as typed, so saving it again sends the same pattern', () => {
    const saved: PatternSpec[] = [
      { type: 'lines', direction: 'angle', angleDeg: 60, spacingUm: 42, count: 7 },
      { type: 'lines', direction: 'vertical', spacingUm: 80, count: 3 },
      { type: 'circle', diameterUm: 180 },
      { type: 'three_circles', largestDiameterUm: 240 },
    ];

    for (const spec of saved) expect(patternOf(formOf(spec), 1234, 987, 0.31)).to.deep.equal(spec);
  });
});

describe('client: measure draft, where the measurement applies', () => {
  it('reads 0 as the whole image and n as band n', () => {
    expect(whereOf(0)).to.deep.equal({ type: 'image' });
    expect(whereOf(2)).to.deep.equal({ type: 'band', band: 2 });
  });

  it('finds bands from the bond-interface polylines only, numbered from the top', () => {
    const annotations = [
      shape('c-bond', 'polyline', [[0, 300], [1000, 310]]),
      shape('c-bond', 'polyline', [[0, 100], [1000, 90]]),
      shape('c-crack', 'polyline', [[0, 500], [1000, 500]]),
      shape('c-bond', 'polygon', [[0, 700], [1000, 700], [500, 750]]),
    ];
    const frame = bandFrame(annotations, classes);

    expect(frame.interfaces).to.have.length(2);
    expect(frame.axis).to.equal('x');
    expect(frame.bands.map((b) => b.number)).to.deep.equal([1, 2, 3]);
    expect(insideWhere(frame, 1, [500, 50])).to.equal(true);
    expect(insideWhere(frame, 2, [500, 200])).to.equal(true);
    expect(insideWhere(frame, 2, [500, 50])).to.equal(false);
    expect(insideWhere(frame, 3, [500, 400])).to.equal(true);
  });

  it('numbers the bands from the left when the interfaces run top to bottom', () => {
    const frame = bandFrame([shape('c-bond', 'polyline', [[400, 0], [410, 1000]])], classes);

    expect(frame.axis).to.equal('y');
    expect(insideWhere(frame, 1, [100, 500])).to.equal(true);
    expect(insideWhere(frame, 2, [100, 500])).to.equal(false);
  });

  it('finds no bands on an image without a bond-interface class or line', () => {
    expect(bandFrame([shape('c-crack', 'polyline', [[0, 0], [10, 10]])], classes).bands).to.deep.equal([]);
    expect(bandFrame([shape('c-x', 'polyline', [[0, 0], [10, 10]])], [cls('c-x', 'Crack')]).bands).to.deep.equal([]);
  });

  it('counts every point for the whole image and none for a band that does not exist', () => {
    const frame = bandFrame([], classes);

    expect(insideWhere(frame, 0, [5, 5])).to.equal(true);
    expect(insideWhere(frame, 4, [5, 5])).to.equal(false);
  });
});

describe('client: measure draft, the request body', () => {
  const draft = (over: Partial<DraftDefinition>): DraftDefinition => ({
    kind: 'intercept',
    pattern: { type: 'circle', diameterUm: 200 },
    band: 0,
    rules: { count: 'intersections', triplePoint: 2 },
    marks: [],
    gridSpacingUm: 25,
    phaseName: 'oxide',
    pointMarks: [],
    thicknessSpacingUm: 10,
    note: '',
    ...over,
  });

  it('sends an intercept count the server accepts, marks stripped of what the page adds', () => {
    const onPage = { x: 10, y: 20, line: 0, kind: 'crossing', status: 'confirmed', hover: true } as DraftMark;
    const body = bodyOf(draft({ marks: [onPage], band: 2 }));

    expect(measurementBody.safeParse(body).success).to.equal(true);
    expect(body).to.include({ kind: 'intercept' });
    expect(body.kind === 'intercept' && body.marks).to.deep.equal([{ x: 10, y: 20, line: 0, kind: 'crossing', status: 'confirmed' }]);
    expect(body.where).to.deep.equal({ type: 'band', band: 2 });
  });

  it('sends only the fields of a point count', () => {
    const body = bodyOf(draft({ kind: 'point_count', pointMarks: [{ x: 1, y: 2, hit: 'boundary', status: 'confirmed' }] }));

    expect(measurementBody.safeParse(body).success).to.equal(true);
    expect(Object.keys(body).sort()).to.deep.equal(['grid', 'kind', 'marks', 'note', 'phaseName', 'placement', 'where']);
    expect(body.kind === 'point_count' && body.grid).to.deep.equal({ spacingUm: 25 });
  });

  it('measures thickness in a band, the first one when none was chosen', () => {
    const chosen = bodyOf(draft({ kind: 'thickness', band: 3 }));
    const unchosen = bodyOf(draft({ kind: 'thickness', band: 0 }));

    expect(measurementBody.safeParse(unchosen).success).to.equal(true);
    expect(chosen.where).to.deep.equal({ type: 'band', band: 3 });
    expect(unchosen.where).to.deep.equal({ type: 'band', band: 1 });
  });
});
