import type { Modality } from '../../../shared/images';

/** The fields grouping needs; structural so tests can pass plain objects. */
export interface GroupableImage {
  id: string;
  locationId: string | null;
  locationName: string | null;
  modality: Modality;
  uploadedAt: string;
}

export interface ModalityGroup<T> {
  modality: Modality;
  images: T[];
}

export interface LocationGroup<T> {
  /** null for images filed on the specimen without a location. */
  locationId: string | null;
  name: string;
  count: number;
  modalities: ModalityGroup<T>[];
}

/**
 * Images of one specimen grouped by location, then by modality. Locations come
 * in the order given (the specimen's list; empty ones are kept so the view can
 * say so), images without a location last; modalities in `modalityOrder`;
 * images newest first within a group.
 */
export function groupImages<T extends GroupableImage>(
  images: readonly T[],
  locations: readonly { id: string; name: string }[],
  modalityOrder: readonly Modality[],
): LocationGroup<T>[] {
  const rank = new Map(modalityOrder.map((m, i) => [m, i]));
  const byLocation = new Map<string | null, T[]>();
  for (const image of images) byLocation.set(image.locationId, [...(byLocation.get(image.locationId) ?? []), image]);

  const group = (locationId: string | null, name: string): LocationGroup<T> => {
    const own = [...(byLocation.get(locationId) ?? [])].sort((a, b) => b.uploadedAt.localeCompare(a.uploadedAt));
    const byModality = new Map<Modality, T[]>();
    for (const image of own) byModality.set(image.modality, [...(byModality.get(image.modality) ?? []), image]);
    const modalities = [...byModality.entries()]
      .sort((a, b) => (rank.get(a[0]) ?? 999) - (rank.get(b[0]) ?? 999))
      .map(([modality, list]) => ({ modality, images: list }));
    return { locationId, name, count: own.length, modalities };
  };

  const known = new Set(locations.map((l) => l.id));
  const groups = locations.map((l) => group(l.id, l.name));
  // Images filed at a location this list does not know (renamed or just added) still show, under their own name.
  for (const [locationId, list] of byLocation) {
    if (locationId !== null && !known.has(locationId)) groups.push(group(locationId, list[0]!.locationName ?? 'another location'));
  }
  if (byLocation.has(null)) groups.push(group(null, 'No location given'));
  return groups;
}
