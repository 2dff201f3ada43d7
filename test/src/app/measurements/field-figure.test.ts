import { expect } from 'chai';
import type { Measurement } from '../../../../shared/measurements/measurement-records';
import { fieldFigure, fieldFigures, figureScaleBar, pixelSizeWords, type FieldImage } from '../../../../src/app/measurements/field-figure';
import { markGlyph, markRadiusFor, pathPolylines } from '../../../../src/app/measurements/mark-glyphs';

const NB = '\u00a0';
const IMAGE: FieldImage['image'] = { id: 'img-1', originalName: 'laminate.tif', width: 900, height: 600 };

/** Only what the figure reads of a saved intercept measurement. */
function interceptM(over: Partial<Record<string, unknown>> = {}, result: Partial<Record<string, unknown>> = {}): Measurement {
  return {
    id: 'm-1',
    whereLabel: 'band 1',
    definition: {
      kind: 'intercept',
      pattern: { type: 'lines', direction: 'horizontal', spacingUm: 50, count: 2 },
      marks: [
        { x: 100, y: 100, line: 0, kind: 'crossing', status: 'confirmed' },
        { x: 300, y: 100, line: 0, kind: 'triple_point', status: 'confirmed' },
        { x: 500, y: 200, line: 1, kind: 'crossing', status: 'suggested' },
      ],
    },
    testLines: [
      { line: 0, family: 'horizontal', pieces: [[[0, 100], [900, 100]]], lengthPx: 900 },
      { line: 1, family: 'horizontal', pieces: [[[0, 200], [400, 200]], [[600, 200], [900, 200]]], lengthPx: 700 },
    ],
    pixelSize: { umPerPx: 0.5, source: 'tiff_resolution' },
    stale: null,
    result: {
      kind: 'intercept', countSymbol: 'P', direction: 'along', byDirection: null, phase: null, marksLeftOut: 0,
      // 1600 px × 0.5 µm/px = 800 µm; P = 1 + 1.5 = 2.5; l̄ = L / P = 320 µm (ASTM E112-13 lineal intercept, hand-computed);
      // G 0 for l̄ 0.320 mm (ASTM E112-13, Table 4), stored a hair below zero as the relation's constants give it.
      lineLengthUm: 800, count: 2.5, meanInterceptUm: 320, g: -0.0003, ...result,
    },
    ...over,
  } as unknown as Measurement;
}

describe('client: field figures, the scale bar of a figure', () => {
  it('picks the largest 1-2-5 length not above a fifth of the picture and converts it to image px', () => {
    // 900 px × 0.5 µm/px = 450 µm wide; a fifth is 90 µm → 50 µm (1-2-5 series, common practice, no source) = 100 px.
    const bar = figureScaleBar(900, 600, 0.5)!;

    expect(bar.label).to.equal('50 µm');
    expect(bar.lengthUm).to.equal(50);
    expect(bar.lengthPx).to.be.closeTo(100, 1e-9);
  });

  it('keeps the bar and its plate inside the picture, the bar within the plate', () => {
    const bar = figureScaleBar(900, 600, 0.5)!;

    expect(bar.plate.x).to.be.above(0);
    expect(bar.plate.y + bar.plate.height).to.be.below(600);
    expect(bar.x + bar.lengthPx).to.be.at.most(bar.plate.x + bar.plate.width);
    expect(bar.y + bar.thicknessPx).to.be.at.most(bar.plate.y + bar.plate.height);
    expect(bar.textY).to.be.below(bar.y);
  });

  it('switches to mm for a wide field and draws nothing without a pixel size', () => {
    // 4000 px × 2 µm/px = 8 mm; a fifth is 1.6 mm → 1 mm (1-2-5 series) = 500 px.
    const wide = figureScaleBar(4000, 3000, 2)!;
    expect(wide.label).to.equal('1 mm');
    expect(wide.lengthPx).to.be.closeTo(500, 1e-9);
    expect(figureScaleBar(900, 600, 0)).to.equal(null);
  });
});

describe('client: field figures, what a figure draws and says', () => {
  it('draws every counted piece of the laid lines and only the confirmed marks', () => {
    const f = fieldFigure(IMAGE, interceptM(), 3)!;

    expect(pathPolylines(f.paths)).to.deep.equal(['0,100 900,100', '0,200 400,200', '600,200 900,200']);
    expect(f.marks.map((m) => m.kind)).to.deep.equal(['crossing', 'triple_point']);
    expect(f.viewBox).to.equal('0 0 900 600');
    expect(f.markRadius).to.equal(markRadiusFor(900));
    expect(f.title).to.equal('Field 3 · laminate.tif · band 1');
  });

  it('states pattern, direction, L, P, l̄, G and the pixel size with its source, each with its unit', () => {
    const f = fieldFigure(IMAGE, interceptM(), 1)!;

    expect(f.caption).to.deep.equal([
      'Pattern: 2 parallel lines horizontal, 50 µm apart; direction along the bond interfaces.',
      `L = 800.0${NB}µm, P = 2.5, l̄ = 320.00${NB}µm, G = 0.0.`,
      `Pixel size 0.5${NB}µm/px, TIFF resolution tags; scale bar 50${NB}µm.`,
    ]);
    expect(f.stale).to.equal(null);
  });

  it('flags a stale field and one with nothing counted', () => {
    const f = fieldFigure(IMAGE, interceptM({ stale: { message: 'The pixel size changed: recompute.' } }, { count: 0, meanInterceptUm: null, g: null }), 1)!;

    expect(f.stale).to.equal('The pixel size changed: recompute.');
    expect(f.caption).to.include('Nothing counted yet: this field is left out of the summary.');
    expect(f.caption[1]).to.equal('L = 800.0\u00a0µm, P = 0, l̄ = —, G = —.');
  });

  it('says both directions for a pattern laid along and across, and all directions for circles', () => {
    const both = fieldFigure(IMAGE, interceptM({}, { byDirection: { along: {}, across: {}, anisotropyIndex: 1 } }), 1)!;
    const circle = interceptM();
    (circle.definition as { pattern: unknown }).pattern = { type: 'circle', diameterUm: 200 };

    expect(both.caption[0]).to.match(/direction along and across the bond interfaces\.$/);
    expect(fieldFigure(IMAGE, circle, 1)!.caption[0]).to.equal('Pattern: one circle, 200 µm across; direction all directions (circles).');
  });

  it('numbers intercept fields across images in order and leaves other kinds out', () => {
    const pointCount = { id: 'pc', definition: { kind: 'point_count' }, result: { kind: 'point_count' } } as unknown as Measurement;
    const figures = fieldFigures([
      { image: IMAGE, measurements: [interceptM(), pointCount] },
      { image: { ...IMAGE, id: 'img-2', originalName: 'second.tif' }, measurements: [interceptM({ id: 'm-2' })] },
    ]);

    expect(figures.map((f) => [f.number, f.imageId, f.measurementId])).to.deep.equal([[1, 'img-1', 'm-1'], [2, 'img-2', 'm-2']]);
  });

  it('names a pixel-size source it does not know by its code', () => {
    expect(pixelSizeWords({ umPerPx: 0.25, source: 'drawn' })).to.equal(`0.25${NB}µm/px, drawn along a scale on the image`);
    expect(pixelSizeWords({ umPerPx: 1, source: 'mystery' })).to.equal(`1${NB}µm/px, mystery`);
  });
});

describe('client: mark glyphs shared by the measuring page and the field figures', () => {
  it('draws each mark kind with its own shape, centred on the mark', () => {
    const at = { x: 100, y: 50, status: 'confirmed' as const };

    expect(markGlyph({ ...at, kind: 'crossing' }, 6)).to.deep.equal({ shape: 'circle', cls: 'mark', cx: 100, cy: 50, r: 6 });
    expect(markGlyph({ ...at, kind: 'tangent' }, 6)).to.deep.equal({ shape: 'rect', cls: 'mark', x: 94, y: 44, width: 12, height: 12 });
    expect(markGlyph({ ...at, kind: 'line_end' }, 6)).to.deep.equal({ shape: 'polygon', cls: 'mark end', points: '100,44 106,50 100,56 94,50' });
    const triple = markGlyph({ ...at, kind: 'triple_point' }, 10);
    expect(triple).to.deep.equal({ shape: 'polygon', cls: 'mark triple', points: '100,37 88,60 112,60' });
  });

  it('draws a suggestion as a ring whatever its kind, marked when it is the one being moved', () => {
    expect(markGlyph({ x: 1, y: 2, kind: 'tangent', status: 'suggested' }, 4)).to.deep.equal({ shape: 'circle', cls: 'suggestion', cx: 1, cy: 2, r: 4 });
    expect(markGlyph({ x: 1, y: 2, kind: 'crossing', status: 'suggested' }, 4, true).cls).to.equal('suggestion selected');
  });

  it('sizes marks to a 150th of the picture width, at least 2 px', () => {
    expect(markRadiusFor(900)).to.equal(6);
    expect(markRadiusFor(150)).to.equal(2);
  });
});
