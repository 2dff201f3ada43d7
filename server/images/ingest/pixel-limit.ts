import { AppError } from '../../http/app-error';

/**
 * Refuses images whose declared size is above the limit, before any pixel is decoded:
 * a few kilobytes can declare gigapixels (a decompression bomb).
 */
export function assertWithinPixelLimit(width: number, height: number, maxPixels: number): void {
  if (width * height <= maxPixels) return;
  const mpx = (n: number) => `${Math.round(n / 1e6).toLocaleString('en')} Mpx`;
  throw new AppError(
    422,
    'image_too_large',
    `This image declares ${width} × ${height} px (${mpx(width * height)}); Etchfile takes images up to ${mpx(maxPixels)}.`,
  );
}
