import type { ImageAlignment as ImageAlignmentDto } from '../../shared/alignments';
import { fitAlignment, swapPairs } from '../../shared/viewer/alignment';
import type { ImageAlignment } from './image-alignment.entity';

/**
 * The alignment as seen from `fromImageId`, which may be either of its two images: from the other
 * side the pairs are swapped and the fit, made again from them, is the inverse.
 */
export function toAlignmentDto(row: ImageAlignment, fromImageId: string): ImageAlignmentDto {
  const forward = row.imageId === fromImageId;
  const pairs = forward ? row.pairs : swapPairs(row.pairs);
  const fit = fitAlignment(pairs);
  return {
    imageId: fromImageId,
    otherImageId: forward ? row.otherImageId : row.imageId,
    kind: fit.kind,
    pairs: pairs.map((p) => ({ image: [p.image[0], p.image[1]], other: [p.other[0], p.other[1]] })),
    transform: fit.transform,
    residualsPx: fit.residualsPx,
    similarityResidualsPx: fit.similarityResidualsPx,
    savedByName: row.savedByUser.displayName,
    savedAt: row.savedAt.toISOString(),
  };
}
