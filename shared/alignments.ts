import { z } from 'zod';
import { MAX_PAIRS, MIN_PAIRS, type Affine, type AlignmentKind } from './viewer/alignment';

/**
 * How another image of the same location lies on this one, saved so nobody aligns the pair twice.
 * Seen from either image: from the other side the pairs are swapped and the transform inverted.
 */
export interface ImageAlignment {
  /** The image it is seen from (the main image in the viewer). */
  imageId: string;
  /** The image laid over it. */
  otherImageId: string;
  kind: AlignmentKind;
  /** Matching points as clicked, in full-resolution px of each image. */
  pairs: { image: [number, number]; other: [number, number] }[];
  /** Other-image px → this image's px. */
  transform: Affine;
  /** Per pair, main-image px; see `AlignmentFit` in shared/viewer/alignment.ts. */
  residualsPx: number[];
  similarityResidualsPx: number[];
  savedByName: string;
  savedAt: string;
}

const coordinate = z.number({ error: 'Enter a number of pixels.' }).finite({ error: 'Enter a finite number of pixels.' });
const point = z.tuple([coordinate, coordinate], { error: 'A point is [x, y] in image pixels.' });

export const alignmentParams = z.strictObject({
  projectId: z.uuid({ error: 'Not a valid project id.' }),
  imageId: z.uuid({ error: 'Not a valid image id.' }),
  otherImageId: z.uuid({ error: 'Not a valid image id.' }),
});

/** The clicked pairs; the server fits the transform itself. */
export const alignmentBody = z.strictObject({
  pairs: z
    .array(z.strictObject({ image: point, other: point }))
    .min(MIN_PAIRS, { error: `Pick at least ${MIN_PAIRS} pairs of matching points.` })
    .max(MAX_PAIRS, { error: `Pick at most ${MAX_PAIRS} pairs of matching points.` }),
});
export type AlignmentBody = z.infer<typeof alignmentBody>;
