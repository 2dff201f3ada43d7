import { z } from 'zod';

export {
  ANNOTATION_COLOURS,
  ANNOTATION_KINDS,
  KINDS_FOR_SHAPE,
  SHAPE_KINDS,
  type AnnotationColour,
  type AnnotationKind,
  type ShapeKind,
} from './kinds';
import { ANNOTATION_COLOURS, ANNOTATION_KINDS, SHAPE_KINDS, type AnnotationColour, type AnnotationKind, type ShapeKind } from './kinds';

export interface AnnotationClass {
  id: string;
  projectId: string;
  name: string;
  colour: AnnotationColour;
  shapeKind: ShapeKind;
  /** Annotations of this class over the whole project. */
  usage: number;
}

/** The classes every new project starts with: the features metallographers mark most. */
export const DEFAULT_ANNOTATION_CLASSES: { name: string; colour: AnnotationColour; shapeKind: ShapeKind }[] = [
  { name: 'Bond interface', colour: 'cobalt', shapeKind: 'line' },
  { name: 'Oxide particle', colour: 'saffron', shapeKind: 'point_or_outline' },
  { name: 'Oxide chain', colour: 'copper', shapeKind: 'line' },
  { name: 'Deformation zone', colour: 'magenta', shapeKind: 'outline' },
  { name: 'Crack / delamination', colour: 'crimson', shapeKind: 'line' },
  { name: 'Pore', colour: 'verdigris', shapeKind: 'point_or_outline' },
  { name: 'Layer', colour: 'slate', shapeKind: 'outline' },
  { name: 'Note', colour: 'lime', shapeKind: 'text' },
];

export type Coordinates = [number, number][];

export interface Annotation {
  id: string;
  imageId: string;
  classId: string;
  kind: AnnotationKind;
  /** Vertices in image pixels; one for points and notes, three for angles, a ring without repeat for outlines. */
  points: Coordinates;
  label: string;
  authorId: string;
  authorName: string;
  createdAt: string;
  updatedAt: string;
  /** Sent back on every change: a stale version means someone else changed it first (409). */
  version: number;
}

const point = z.tuple([z.number().finite(), z.number().finite()]);

export const annotationBody = z.strictObject({
  classId: z.uuid({ error: 'Choose an annotation class.' }),
  kind: z.enum(ANNOTATION_KINDS),
  points: z.array(point).min(1, { error: 'A shape needs at least one point.' }).max(20_000, { error: 'A shape may have at most 20 000 points.' }),
  label: z.string().trim().max(2000).default(''),
});
export type AnnotationBody = z.infer<typeof annotationBody>;

export const updateAnnotationBody = annotationBody.partial().extend({ version: z.number().int().min(1) });
export type UpdateAnnotationBody = z.infer<typeof updateAnnotationBody>;

export const annotationClassBody = z.strictObject({
  name: z.string().trim().min(1, { error: 'Enter a name.' }).max(60),
  colour: z.enum(Object.keys(ANNOTATION_COLOURS) as [AnnotationColour, ...AnnotationColour[]]),
  shapeKind: z.enum(SHAPE_KINDS),
});
export type AnnotationClassBody = z.infer<typeof annotationClassBody>;
