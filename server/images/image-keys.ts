/**
 * Where an image's files live in the store. Originals are content-addressed (the same bytes
 * always land on the same key, so a retried upload never writes a second copy); derivatives
 * sit under the image's id.
 */
export const imageKeys = {
  original: (projectId: string, sha256: string) => `projects/${projectId}/originals/${sha256}`,
  derivatives: (projectId: string, imageId: string) => `projects/${projectId}/images/${imageId}/`,
  thumbnail: (projectId: string, imageId: string) => `projects/${projectId}/images/${imageId}/thumbnail.jpg`,
  preview: (projectId: string, imageId: string) => `projects/${projectId}/images/${imageId}/preview.jpg`,
  tiles: (projectId: string, imageId: string) => `projects/${projectId}/images/${imageId}/tiles/`,
  tile: (projectId: string, imageId: string, level: number, column: number, row: number) =>
    `projects/${projectId}/images/${imageId}/tiles/${level}/${column}_${row}.jpg`,
};

/** Longest edge of the thumbnail and of the screen preview, px. */
export const THUMBNAIL_EDGE = 256;
export const PREVIEW_EDGE = 1600;

/** Bumped whenever derivatives are made differently, so cached copies (ETags) are replaced. */
export const DERIVATIVES_VERSION = 1;
