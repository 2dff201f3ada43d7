import type { Annotation, AnnotationKind, Coordinates } from './annotations';

/**
 * GeoJSON (RFC 7946) exchange of annotations. The coordinates are image pixels
 * (x right, y down, full resolution), not longitude/latitude: the file says so in
 * its `etchfile:coordinates` member, a foreign member RFC 7946 §6.1 allows.
 */
export interface FeatureCollection {
  type: 'FeatureCollection';
  'etchfile:coordinates': 'image-pixels';
  'etchfile:image'?: { id: string; width: number; height: number; pixelSizeUm: number | null };
  features: Feature[];
}

export interface Feature {
  type: 'Feature';
  id?: string;
  geometry: { type: 'Point'; coordinates: [number, number] } | { type: 'LineString'; coordinates: Coordinates } | { type: 'Polygon'; coordinates: Coordinates[] };
  properties: { kind: AnnotationKind; class: string; label: string; author?: string; updatedAt?: string };
}

/** One annotation as a feature; outlines become closed rings (first position repeated last, RFC 7946 §3.1.6). */
export function toFeature(a: Pick<Annotation, 'id' | 'kind' | 'points' | 'label' | 'authorName' | 'updatedAt'>, className: string): Feature {
  const properties = { kind: a.kind, class: className, label: a.label, author: a.authorName, updatedAt: a.updatedAt };
  if (a.kind === 'point' || a.kind === 'text') return { type: 'Feature', id: a.id, geometry: { type: 'Point', coordinates: a.points[0]! }, properties };
  if (a.kind === 'polygon' || a.kind === 'rectangle') {
    return { type: 'Feature', id: a.id, geometry: { type: 'Polygon', coordinates: [[...a.points, a.points[0]!]] }, properties };
  }
  return { type: 'Feature', id: a.id, geometry: { type: 'LineString', coordinates: a.points }, properties };
}

export interface ImportedShape {
  kind: AnnotationKind;
  className: string;
  points: Coordinates;
  label: string;
}

/**
 * Reads features back into shapes, or explains, per feature, what is wrong. Accepts
 * Point, LineString and single-ring Polygon; a feature without an Etchfile `kind`
 * gets the natural one (point, polyline, polygon).
 */
export function fromFeatureCollection(input: unknown): { shapes: ImportedShape[]; problems: string[] } {
  const problems: string[] = [];
  const shapes: ImportedShape[] = [];
  const fc = input as { type?: unknown; features?: unknown };
  if (!fc || fc.type !== 'FeatureCollection' || !Array.isArray(fc.features)) {
    return { shapes, problems: ['The file is not a GeoJSON FeatureCollection.'] };
  }
  fc.features.forEach((raw: unknown, i: number) => {
    const f = raw as { type?: unknown; geometry?: { type?: unknown; coordinates?: unknown }; properties?: Record<string, unknown> | null };
    const where = `Feature ${i + 1}`;
    if (f?.type !== 'Feature' || !f.geometry) return void problems.push(`${where} is not a GeoJSON Feature with a geometry.`);
    const props = f.properties ?? {};
    const className = typeof props['class'] === 'string' ? props['class'] : '';
    const label = typeof props['label'] === 'string' ? props['label'] : '';
    const kind = typeof props['kind'] === 'string' ? (props['kind'] as AnnotationKind) : undefined;
    const coords = f.geometry.coordinates;
    switch (f.geometry.type) {
      case 'Point':
        if (!isPosition(coords)) return void problems.push(`${where}: a Point needs one [x, y] position.`);
        return void shapes.push({ kind: kind === 'text' ? 'text' : 'point', className, points: [[coords[0], coords[1]]], label });
      case 'LineString':
        if (!isPositions(coords)) return void problems.push(`${where}: a LineString needs [x, y] positions.`);
        return void shapes.push({ kind: kind === 'ruler' || kind === 'angle' ? kind : 'polyline', className, points: coords.map(([x, y]) => [x, y]), label });
      case 'Polygon': {
        if (!Array.isArray(coords) || coords.length !== 1 || !isPositions(coords[0])) {
          return void problems.push(`${where}: only polygons with a single outer ring and no holes can be imported.`);
        }
        const ring = coords[0].map(([x, y]) => [x, y] as [number, number]);
        const first = ring[0]!;
        const last = ring[ring.length - 1]!;
        if (ring.length > 1 && first[0] === last[0] && first[1] === last[1]) ring.pop();
        return void shapes.push({ kind: kind === 'rectangle' ? 'rectangle' : 'polygon', className, points: ring, label });
      }
      default:
        return void problems.push(`${where}: geometry type ${String(f.geometry.type)} cannot be imported (use Point, LineString or Polygon).`);
    }
  });
  return { shapes, problems };
}

function isPosition(v: unknown): v is [number, number] {
  return Array.isArray(v) && v.length >= 2 && v.every((n) => typeof n === 'number' && Number.isFinite(n));
}

function isPositions(v: unknown): v is [number, number][] {
  return Array.isArray(v) && v.length > 0 && v.every(isPosition);
}
