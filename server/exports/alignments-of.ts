import type { EntityManager } from 'typeorm';
import type { AlignmentKind, Affine } from '../../shared/viewer/alignment';
import { ImageAlignment } from '../alignments/image-alignment.entity';
import { toAlignmentDto } from '../alignments/image-alignment.mapper';

/** An image as alignments.json names it: its id (as in images.csv) and its file name. */
interface NamedImage {
  id: string;
  name: string;
}

/** One saved alignment as the supplementary data gives it (other image px → image px). */
export interface ExportedAlignment {
  image: NamedImage;
  otherImage: NamedImage;
  kind: AlignmentKind;
  pairs: { image: [number, number]; other: [number, number] }[];
  transform: Affine;
  residualsPx: number[];
  savedBy: string;
  savedAt: string;
}

/**
 * The project's saved alignments, oldest first, seen from the image each was made on. The transform is
 * fitted again from the pairs, as the viewer does, so the file says what people saw.
 * `names` maps image ids to file names (the project's images).
 */
export async function alignmentsOf(m: EntityManager, projectId: string, names: ReadonlyMap<string, string>): Promise<ExportedAlignment[]> {
  const rows = await m.find(ImageAlignment, { where: { projectId }, relations: { savedByUser: true }, order: { savedAt: 'ASC' } });
  return rows.map((row) => {
    const a = toAlignmentDto(row, row.imageId);
    return {
      image: { id: a.imageId, name: names.get(a.imageId) ?? '' },
      otherImage: { id: a.otherImageId, name: names.get(a.otherImageId) ?? '' },
      kind: a.kind,
      pairs: a.pairs,
      transform: a.transform,
      residualsPx: a.residualsPx,
      savedBy: a.savedByName,
      savedAt: a.savedAt,
    };
  });
}
