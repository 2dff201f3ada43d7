/**
 * Annotation kinds, class shapes and the class palette, without zod: the viewer imports these, and
 * the schema library stays out of its download (annotations.ts re-exports them with the schemas).
 */

/** What a class of annotation is drawn as. `point_or_outline` classes accept either. */
export const SHAPE_KINDS = ['line', 'point', 'outline', 'point_or_outline', 'text'] as const;
export type ShapeKind = (typeof SHAPE_KINDS)[number];

/** The drawing tools' shapes, stored in full-resolution image pixels (x right, y down). */
export const ANNOTATION_KINDS = ['polyline', 'polygon', 'rectangle', 'point', 'ruler', 'angle', 'text'] as const;
export type AnnotationKind = (typeof ANNOTATION_KINDS)[number];

/** Which tool shapes fit which class kind. Rulers and angles are measurements and fit any class. */
export const KINDS_FOR_SHAPE: Record<ShapeKind, readonly AnnotationKind[]> = {
  line: ['polyline', 'ruler', 'angle'],
  point: ['point', 'ruler', 'angle'],
  outline: ['polygon', 'rectangle', 'ruler', 'angle'],
  point_or_outline: ['point', 'polygon', 'rectangle', 'ruler', 'angle'],
  text: ['text', 'ruler', 'angle'],
};

/** Our palette for annotation classes: distinct on light and dark micrographs. */
export const ANNOTATION_COLOURS = {
  cobalt: '#3a5bd9',
  saffron: '#e6a700',
  copper: '#c8743a',
  magenta: '#c2378a',
  crimson: '#d1343f',
  verdigris: '#2a9d8f',
  slate: '#7a8894',
  lime: '#7db61c',
} as const;
export type AnnotationColour = keyof typeof ANNOTATION_COLOURS;
