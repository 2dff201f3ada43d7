import type { AnnotationKind, Coordinates } from './annotations';
import { polylineLength, ringProblem } from './geometry';

/**
 * Why a shape cannot be stored as given, or null when it can. Checked by the server
 * on every save and import, and by the client before it sends.
 */
export function shapeProblem(kind: AnnotationKind, points: Coordinates, image: { width: number; height: number }, label = ''): string | null {
  const outside = points.find(([x, y]) => x < 0 || y < 0 || x > image.width || y > image.height);
  if (outside) return `The point (${outside[0]}, ${outside[1]}) lies outside the image (${image.width} × ${image.height} px).`;
  switch (kind) {
    case 'point':
      return points.length === 1 ? null : 'A point has exactly one position.';
    case 'text':
      if (points.length !== 1) return 'A note is pinned at exactly one position.';
      return label.trim() ? null : 'A note needs its text.';
    case 'angle':
      return points.length === 3 ? null : 'An angle needs exactly three points: end, vertex, end.';
    case 'ruler':
    case 'polyline':
      if (points.length < 2) return 'A line needs at least two points.';
      if (kind === 'ruler' && points.length !== 2) return 'A ruler has exactly two ends.';
      return polylineLength(points) > 0 ? null : 'The line has zero length.';
    case 'rectangle':
      if (points.length !== 4) return 'A rectangle has four corners.';
      return ringProblem(points);
    case 'polygon':
      return ringProblem(points);
  }
}
