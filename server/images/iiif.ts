import { iiifScaleFactors, pyramidLevels, TILE_SIZE } from '../../shared/tile-pyramid';

/** A Deep Zoom tile: level (0 = 1×1), column, row. */
export interface TileAddress {
  level: number;
  column: number;
  row: number;
}

/**
 * The IIIF Image API 3.0 level-0 description of an image's tile set: a viewer that reads it asks
 * only for the pre-cut tiles (`tiles` with its scale factors) and the whole-image `sizes`.
 */
export function iiifInfo(id: string, width: number, height: number) {
  const levels = pyramidLevels(width, height);
  const sizes = levels.filter((l) => l.columns === 1 && l.rows === 1 && Math.min(l.width, l.height) >= 16).map((l) => ({ width: l.width, height: l.height }));
  return {
    '@context': 'http://iiif.io/api/image/3/context.json',
    id,
    type: 'ImageService3',
    protocol: 'http://iiif.io/api/image',
    profile: 'level0',
    width,
    height,
    maxWidth: width,
    maxHeight: height,
    ...(sizes.length > 0 ? { sizes } : {}),
    tiles: [{ width: TILE_SIZE, height: TILE_SIZE, scaleFactors: iiifScaleFactors(width, height) }],
    preferredFormats: ['jpg'],
  };
}

/**
 * Maps an IIIF request for one of the tiles `iiifInfo` announces to its Deep Zoom tile, or null
 * when the request asks for something a level-0 service does not have (other regions, sizes,
 * rotations, qualities or formats).
 */
export function tileForIiifRequest(width: number, height: number, region: string, size: string, rotation: string, qualityFormat: string): TileAddress | null {
  if (rotation !== '0' || qualityFormat !== 'default.jpg') return null;
  const r = region === 'full' ? [0, 0, width, height] : /^\d+,\d+,\d+,\d+$/.test(region) ? region.split(',').map(Number) : null;
  const s = /^(\d+),(\d*)$/.exec(size);
  if (!r || !s) return null;
  const [x, y, w, h] = r as [number, number, number, number];
  const levels = pyramidLevels(width, height);
  const top = levels.length - 1;
  for (const factor of iiifScaleFactors(width, height)) {
    const span = TILE_SIZE * factor;
    if (x % span !== 0 || y % span !== 0) continue;
    // The region a tile covers at this scale, clipped at the image's edge (IIIF 3.0, §4.1 tiles).
    if (w !== Math.min(span, width - x) || h !== Math.min(span, height - y)) continue;
    const sw = Math.ceil(w / factor);
    const sh = Math.ceil(h / factor);
    if (Number(s[1]) !== sw || (s[2] !== '' && Number(s[2]) !== sh)) continue;
    const level = top - Math.log2(factor);
    return { level, column: x / span, row: y / span };
  }
  return null;
}

/** The Deep Zoom descriptor (.dzi) of the same tile set. */
export function deepZoomDescriptor(width: number, height: number): string {
  return (
    '<?xml version="1.0" encoding="UTF-8"?>\n' +
    `<Image xmlns="http://schemas.microsoft.com/deepzoom/2008" Format="jpg" Overlap="0" TileSize="${TILE_SIZE}">\n` +
    `  <Size Width="${width}" Height="${height}"/>\n</Image>\n`
  );
}
