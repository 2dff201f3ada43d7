import { expect } from 'chai';
import { fromFeatureCollection, toFeature } from '../../../shared/annotations/geojson';

describe('annotations: GeoJSON mapping', () => {
  const base = { id: 'a', label: '', authorName: 'x', updatedAt: '2026-01-01T00:00:00Z' };

  it('maps kinds to RFC 7946 geometry types', () => {
    // RFC 7946 §3.1.2 Point, §3.1.4 LineString, §3.1.6 Polygon (closed ring).
    expect(toFeature({ ...base, kind: 'point', points: [[1, 2]] }, 'Pore').geometry).to.deep.equal({ type: 'Point', coordinates: [1, 2] });
    expect(toFeature({ ...base, kind: 'ruler', points: [[0, 0], [3, 4]] }, 'c').geometry.type).to.equal('LineString');
    expect(toFeature({ ...base, kind: 'rectangle', points: [[0, 0], [2, 0], [2, 1], [0, 1]] }, 'c').geometry).to.deep.equal({
      type: 'Polygon',
      coordinates: [[[0, 0], [2, 0], [2, 1], [0, 1], [0, 0]]],
    });
  });

  it('reads features back, dropping the repeated closing position and keeping the kind', () => {
    const fc = { type: 'FeatureCollection', features: [toFeature({ ...base, kind: 'rectangle', points: [[0, 0], [2, 0], [2, 1], [0, 1]] }, 'Layer')] };
    const { shapes, problems } = fromFeatureCollection(fc);
    expect(problems).to.deep.equal([]);
    expect(shapes[0]).to.deep.equal({ kind: 'rectangle', className: 'Layer', points: [[0, 0], [2, 0], [2, 1], [0, 1]], label: '' });
  });

  it('gives plain GeoJSON from elsewhere natural kinds, and refuses holes', () => {
    const { shapes, problems } = fromFeatureCollection({
      type: 'FeatureCollection',
      features: [
        { type: 'Feature', geometry: { type: 'LineString', coordinates: [[0, 0], [1, 1]] }, properties: null },
        { type: 'Feature', geometry: { type: 'Polygon', coordinates: [[[0, 0], [4, 0], [4, 4], [0, 0]], [[1, 1], [2, 1], [2, 2], [1, 1]]] }, properties: {} },
      ],
    });
    expect(shapes.map((s) => s.kind)).to.deep.equal(['polyline']);
    expect(problems[0]).to.contain('no holes');
  });
});
