import { expect } from 'chai';
import type { Annotation, AnnotationClass } from '../../../../shared/annotations/annotations';
import type { Point } from '../../../../shared/annotations/geometry';
import type { Measurement } from '../../../../shared/measurements/measurement-records';
import { patternLines } from '../../../../shared/measurements/patterns';
import { bandFrame, bodyOf, DEFAULT_PATTERN, type DraftDefinition } from '../../../../src/app/measurements/measure-draft';
import {
  countedPieces,
  countsPerSubBand,
  evenEdges,
  insidePlace,
  offsetPolyline,
  parseBinEdges,
  placeValue,
  pointCountChoices,
  regionChoices,
  subBandEdgeLines,
  whereOfPlace,
} from '../../../../src/app/measurements/measure-where';
import { detectorHint } from '../../../../src/app/measurements/measure-units';

const classes: AnnotationClass[] = [
  { id: 'c-bond', projectId: 'p', name: 'Bond interface', colour: 'cobalt', shapeKind: 'line', usage: 0 },
  { id: 'c-zone', projectId: 'p', name: 'Deformation zone', colour: 'amber', shapeKind: 'outline', usage: 0 },
] as AnnotationClass[];
const shape = (id: string, classId: string, kind: Annotation['kind'], points: [number, number][], label = ''): Annotation => ({
  id, imageId: 'img', classId, kind, points, label, authorId: 'u', authorName: 'Ana', createdAt: '', updatedAt: '', version: 1,
});
// A 1000 × 600 px image with one interface at y = 300 and a rectangle region x 200–800, y 200–400.
const shapes = [
  shape('bond', 'c-bond', 'polyline', [[0, 300], [1000, 300]]),
  shape('zone', 'c-zone', 'rectangle', [[200, 200], [800, 200], [800, 400], [200, 400]], 'near bond'),
  shape('dot', 'c-zone', 'point', [[10, 10]]),
  shape('other', 'c-zone', 'polygon', [[0, 0], [50, 0], [50, 50]]),
];
const frame = bandFrame(shapes, classes);
const regions = regionChoices(shapes, classes);

describe('measurements client: where to measure, sub-bands, point counts for V_V', () => {
  it('offers polygons and rectangles as regions by class and label, and nothing else', () => {
    expect(regions.map((r) => [r.id, r.label])).to.deep.equal([
      ['zone', 'Deformation zone · near bond'],
      ['other', 'Deformation zone · unlabelled outline 2'],
    ]);
  });

  it('turns a choice into a where and back', () => {
    for (const value of ['image', 'band:2', 'region:zone']) expect(placeValue(whereOfPlace(value))).to.equal(value);
    expect(whereOfPlace('region:zone')).to.deep.equal({ type: 'region', annotationId: 'zone' });
    expect(whereOfPlace('band:1')).to.deep.equal({ type: 'band', band: 1 });
  });

  it('tells points inside a region or band from those outside', () => {
    const region = whereOfPlace('region:zone');
    expect(insidePlace(region, frame, regions, [500, 250])).to.equal(true);
    expect(insidePlace(region, frame, regions, [500, 450])).to.equal(false);
    expect(insidePlace(whereOfPlace('band:1'), frame, regions, [500, 250])).to.equal(true);
    expect(insidePlace(whereOfPlace('band:2'), frame, regions, [500, 250])).to.equal(false);
    expect(insidePlace(whereOfPlace('region:gone'), frame, regions, [500, 250]), 'a deleted outline holds nothing').to.equal(false);
  });

  it('clips the pattern to the region for drawing: horizontal lines keep the 600 px inside it, a circle its arcs', () => {
    // Three lines 50 px apart at 1 µm/px, centred: y = 250, 300, 350, each keeping x 200–800 (hand-computed).
    const lines = patternLines({ type: 'lines', direction: 'horizontal', spacingUm: 50, count: 3 }, 1000, 600, 1);
    const pieces = countedPieces(lines, whereOfPlace('region:zone'), frame, regions);
    expect(pieces.map(([a, b]) => [a[1], Math.round(a[0] * 1e6) / 1e6, Math.round(b[0] * 1e6) / 1e6])).to.deep.equal([[250, 200, 800], [300, 200, 800], [350, 200, 800]]);
    // A circle of radius 150 px about (500, 300) lies wholly inside the 600 × 200 rectangle only where |y − 300| ≤ 100:
    // kept arc = 4·r·asin(100/150) (hand-computed), drawn as chords of a 240-gon (within 0.1 %).
    const circle = patternLines({ type: 'circle', diameterUm: 300 }, 1000, 600, 1);
    const arcs = countedPieces(circle, whereOfPlace('region:zone'), frame, regions);
    const length = arcs.reduce((sum, [a, b]) => sum + Math.hypot(b[0] - a[0], b[1] - a[1]), 0);
    expect(length).to.be.closeTo(4 * 150 * Math.asin(100 / 150), 4 * 150 * Math.asin(100 / 150) * 1e-3);
    expect(countedPieces(lines, whereOfPlace('image'), frame, regions), 'the whole image draws no extra pieces').to.deep.equal([]);
  });

  it('reads sub-band edges typed with commas or spaces, and says what is wrong otherwise', () => {
    expect(parseBinEdges('0, 20, 40 60')).to.deep.equal({ edges: [0, 20, 40, 60], error: '' });
    expect(parseBinEdges('  ')).to.deep.equal({ edges: null, error: '' });
    expect(parseBinEdges('0, 40, 20').error).to.contain('farther from the interface');
    expect(parseBinEdges('20').error).to.contain('at least two edges');
    expect(parseBinEdges('-5, 10').error).to.contain('negative');
    expect(parseBinEdges('0, ten').error).to.contain('numbers in µm');
    expect(evenEdges(20, 3)).to.deep.equal([0, 20, 40, 60]);
  });

  it('draws each sub-band edge at its distance on both sides of the interface, only inside the chosen place', () => {
    // 0.5 µm/px: 20 µm = 40 px, so the edges lie at y = 260 and 340 (hand-computed).
    const inRegion = (p: Point) => insidePlace(whereOfPlace('region:zone'), frame, regions, p);
    const lines = subBandEdgeLines(frame, [0, 20], 0.5, inRegion);
    expect(lines).to.have.length(2);
    const ys = lines.map((l) => l.points[0]![1]).sort((a, b) => a - b);
    expect(ys[0]).to.be.closeTo(260, 1e-9);
    expect(ys[1]).to.be.closeTo(340, 1e-9);
    for (const l of lines) for (const p of l.points) expect(p[0]).to.be.within(200, 800);
    // A 45° segment offset by √2 moves one unit along each axis (hand-computed).
    const moved = offsetPolyline([[0, 0], [10, 10]], Math.SQRT2);
    expect(moved[0]![0]).to.be.closeTo(-1, 1e-12);
    expect(moved[0]![1]).to.be.closeTo(1, 1e-12);
  });

  it('offers only point counts of the same place that found the phase, newest first', () => {
    const pc = (id: string, where: Measurement['definition']['where'], fraction: number, version = 1) =>
      ({ id, kind: 'point_count', version, authorName: 'Ana', whereLabel: 'here', definition: { kind: 'point_count', where }, result: { kind: 'point_count', phaseName: 'ferrite', pointFraction: fraction } }) as unknown as Measurement;
    const saved = [pc('a', { type: 'region', annotationId: 'zone' }, 0.25), pc('b', { type: 'image' }, 0.3), pc('c', { type: 'region', annotationId: 'zone' }, 0), pc('d', { type: 'region', annotationId: 'zone' }, 0.4, 2)];
    const choices = pointCountChoices(saved, whereOfPlace('region:zone'));
    expect(choices.map((c) => c.id)).to.deep.equal(['d', 'a']);
    expect(choices[0]!.label).to.equal('ferrite: P_p 40.0 % on here (version 2, Ana)');
  });

  it('puts the region, the sub-band edges and the phase from a point count into the request body', () => {
    const draft: DraftDefinition = {
      kind: 'intercept', pattern: { type: 'lines', direction: 'horizontal', spacingUm: 50, count: DEFAULT_PATTERN.count }, band: 0, rules: { count: 'intercepts', triplePoint: 1.5 },
      marks: [], gridSpacingUm: 25, phaseName: 'oxide', pointMarks: [], thicknessSpacingUm: 10, note: '',
      regionId: 'zone', distanceBinsUm: [0, 20, 40], phase: { name: 'ferrite', pointCountId: 'd' },
    };
    const body = bodyOf(draft);
    expect(body).to.deep.include({ where: { type: 'region', annotationId: 'zone' }, distanceBinsUm: [0, 20, 40], phase: { name: 'ferrite', pointCountId: 'd' } });
  });
});

describe('measurements client: the crossing finder', () => {
  it('says which finder is usual for the image and when the chosen one is not', () => {
    expect(detectorHint('lom_bright_field', 'valleys')).to.contain('This is the usual choice for lom bright field images.');
    expect(detectorHint('ebsd_orientation', 'valleys')).to.contain('Ebsd orientation images are usually searched for changes of colour or brightness.');
    expect(detectorHint('sem_secondary', 'steps')).to.contain('There is no usual choice for sem secondary images.');
  });
});

describe('measurements client: live counts per sub-band', () => {
  it('sorts confirmed marks into sub-bands by distance from the nearest interface, an edge mark to the farther one', () => {
    // Interface at y = 300, 0.5 µm/px: marks 10 px (5 µm), 40 px (20 µm, on the edge), 120 px (60 µm, the outer edge) away,
    // a triple point 70 px (35 µm) away counting 1½, and a suggestion that does not count (hand-computed; E112 mark values).
    const rules = { count: 'intersections' as const, triplePoint: 1.5 };
    const marks = [
      { x: 100, y: 310, line: 0, kind: 'crossing' as const, status: 'confirmed' as const },
      { x: 100, y: 260, line: 0, kind: 'crossing' as const, status: 'confirmed' as const },
      { x: 100, y: 420, line: 0, kind: 'crossing' as const, status: 'confirmed' as const },
      { x: 100, y: 230, line: 0, kind: 'triple_point' as const, status: 'confirmed' as const },
      { x: 100, y: 305, line: 0, kind: 'crossing' as const, status: 'suggested' as const },
    ];
    const bins = countsPerSubBand(marks, frame.interfaces, [0, 20, 40, 60], 0.5, rules);
    expect(bins).to.deep.equal([
      { minUm: 0, maxUm: 20, count: 1 },
      { minUm: 20, maxUm: 40, count: 2.5 },
      { minUm: 40, maxUm: 60, count: 1 },
    ]);
  });
});
