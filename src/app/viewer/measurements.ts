import type { AnnotationKind, Coordinates } from '../../../shared/annotations/annotations';
import { angleDeg, polylineLength, ringArea, ringPerimeter, type Point } from '../../../shared/annotations/geometry';
import { formatArea, formatLength } from '../../../shared/viewer/units';

/**
 * What a shape measures, as people read it: in µm/nm/mm through the image's pixel size, or in
 * pixels (and said so) when the image is uncalibrated. Pure.
 */
export interface Measurement {
  /** "Length", "Area", "Perimeter", "Angle". */
  name: string;
  value: string;
}

export function formatPixels(px: number, digits = 4): string {
  return `${Number(px.toPrecision(digits))} px`;
}

export function formatPixelArea(px2: number, digits = 4): string {
  return `${Number(px2.toPrecision(digits))} px²`;
}

const length = (px: number, umPerPx: number | null) => (umPerPx ? formatLength(px * umPerPx) : formatPixels(px));

/** The measurements of one shape; empty for points and notes. */
export function measure(kind: AnnotationKind, points: Coordinates, umPerPx: number | null): Measurement[] {
  switch (kind) {
    case 'polyline':
    case 'ruler':
      return [{ name: 'Length', value: length(polylineLength(points), umPerPx) }];
    case 'polygon':
    case 'rectangle': {
      const area = ringArea(points);
      return [
        { name: 'Area', value: umPerPx ? formatArea(area * umPerPx * umPerPx) : formatPixelArea(area) },
        { name: 'Perimeter', value: length(ringPerimeter(points), umPerPx) },
      ];
    }
    case 'angle':
      return points.length === 3 ? [{ name: 'Angle', value: formatDegrees(angleDeg(points[0]!, points[1]!, points[2]!)) }] : [];
    default:
      return [];
  }
}

/** One line for a label on the canvas: "12.5 µm", "45.0°", "1.2 mm² · 4.4 mm". */
export function measurementLabel(kind: AnnotationKind, points: Coordinates, umPerPx: number | null): string {
  return measure(kind, points, umPerPx)
    .map((m) => m.value)
    .join(' · ');
}

export function formatDegrees(deg: number): string {
  return `${deg.toFixed(1)}°`;
}

/** The cursor's position: calibrated first when the image has a pixel size, always in pixels too. */
export function cursorReadout(p: Point, umPerPx: number | null): { calibrated: string | null; pixels: string } {
  const pixels = `${Math.floor(p[0])}, ${Math.floor(p[1])} px`;
  if (!umPerPx) return { calibrated: null, pixels };
  return { calibrated: `x ${formatLength(p[0] * umPerPx, 4)}, y ${formatLength(p[1] * umPerPx, 4)}`, pixels };
}

/** Where a point sits: "742 µm, 475 µm from the top left", or in pixels when uncalibrated. */
export function positionLabel(p: Point, umPerPx: number | null): string {
  if (!umPerPx) return `at ${Math.round(p[0])}, ${Math.round(p[1])} px`;
  return `at ${formatLength(p[0] * umPerPx)}, ${formatLength(p[1] * umPerPx)}`;
}
