import { mkdir, rm } from 'node:fs/promises';
import path from 'node:path';
import sharp, { type OverlayOptions } from 'sharp';
import { In, type EntityManager } from 'typeorm';
import { commonBarLengthUm, layoutPanels, type ExportFigureBody, type FigureSpec } from '../../shared/figures';
import { niceLengthAtMost } from '../../shared/viewer/scale-bar';
import { AnnotationClass } from '../annotations/annotation-class.entity';
import { Annotation } from '../annotations/annotation.entity';
import type { AppContext } from '../app-context';
import { AppError } from '../http/app-error';
import { Image } from '../images/image.entity';
import { displaySource } from '../jobs/display-source';
import { download } from '../jobs/derivatives.job';
import { panelOverlaySvg } from './panel-overlay';

/**
 * Renders a figure on the server: each panel cut from the archived original (never changed),
 * annotations and scale bar composited as vector graphics, resolution written into the file.
 */
export async function renderFigure(ctx: AppContext, m: EntityManager, projectId: string, spec: FigureSpec, out: ExportFigureBody): Promise<Buffer> {
  const layout = layoutPanels(spec, out.widthMm, out.dpi);
  if (layout.width * layout.height > ctx.config.images.maxPixels) {
    throw new AppError(422, 'image_too_large', `That export would be ${layout.width} × ${layout.height} px, above the limit of ${ctx.config.images.maxPixels.toLocaleString('en')} px. Lower the width or the dpi.`);
  }
  const images = new Map((await m.findBy(Image, { id: In(spec.panels.map((p) => p.imageId)), projectId })).map((i) => [i.id, i]));
  spec.panels.forEach((p, i) => {
    if (!images.has(p.imageId)) throw AppError.conflict(`The image of panel ${p.letter || i + 1} no longer exists; choose another image or remove the panel.`);
  });
  const classes = new Map((await m.findBy(AnnotationClass, { projectId })).map((c) => [c.id, c]));
  const pxPerMm = out.dpi / 25.4;
  const fieldWidths = spec.panels.map((p) => (images.get(p.imageId)!.pixelSizeUm ? p.region.width * images.get(p.imageId)!.pixelSizeUm! : null));
  const common = spec.commonScaleBar ? commonBarLengthUm(fieldWidths) : null;

  const work = path.join(ctx.config.storageDir, 'tmp', 'figures', `${Date.now()}-${Math.random().toString(36).slice(2)}`);
  await mkdir(work, { recursive: true });
  try {
    const layers: OverlayOptions[] = [];
    for (const [i, panel] of spec.panels.entries()) {
      const image = images.get(panel.imageId)!;
      const box = layout.boxes[i]!;
      const r = panel.region;
      if (r.x + r.width > image.width + 0.5 || r.y + r.height > image.height + 0.5) {
        throw new AppError(422, 'validation_failed', `Panel ${panel.letter || i + 1} reaches outside its image (${image.width} × ${image.height} px).`);
      }
      const file = ctx.files.pathOnDisk?.(image.originalKey) ?? (await download(ctx.files, image.originalKey, path.join(work, `original-${i}`)));
      const open = await displaySource(file, image, ctx.config.images.maxPixels);
      const region = { left: Math.floor(r.x), top: Math.floor(r.y), width: Math.round(r.width), height: Math.round(r.height) };
      const pixels = await open().extract(region).resize(box.width, box.height, { fit: 'fill' }).toColourspace('srgb').png().toBuffer();
      layers.push({ input: pixels, left: box.left, top: box.top });

      const shapes = panel.classIds.length
        ? (await m.find(Annotation, { where: { imageId: image.id, classId: In(panel.classIds) }, order: { seq: 'ASC' } })).map((a) => ({ kind: a.kind, points: a.points, label: a.label, colour: classes.get(a.classId)!.colour }))
        : [];
      const legend = panel.classIds.flatMap((id) => (classes.has(id) ? [{ name: classes.get(id)!.name, colour: classes.get(id)!.colour }] : []));
      const umPerImagePx = image.pixelSizeUm;
      let bar = null;
      if (panel.scaleBar.show && umPerImagePx) {
        const lengthUm = panel.scaleBar.lengthUm ?? common ?? niceLengthAtMost(r.width * umPerImagePx * 0.2);
        const colour = panel.scaleBar.colour === 'auto' ? await contrastingColour(pixels, box, panel.scaleBar.position) : panel.scaleBar.colour;
        bar = { lengthUm, umPerImagePx, colour };
      }
      const svg = panelOverlaySvg({ panel, box, pxPerMm, shapes, legend, bar });
      layers.push({ input: Buffer.from(svg), left: box.left, top: box.top });
    }
    const canvas = sharp({ create: { width: layout.width, height: layout.height, channels: 3, background: '#ffffff' } }).composite(layers);
    // PNG keeps the dpi in pHYs; for TIFF libvips takes px/mm and writes XResolution in the unit asked for.
    return out.format === 'png'
      ? canvas.png({ compressionLevel: 7 }).withMetadata({ density: out.dpi }).toBuffer()
      : canvas.tiff({ compression: 'lzw', xres: pxPerMm, yres: pxPerMm, resolutionUnit: 'inch' }).toBuffer();
  } finally {
    await rm(work, { recursive: true, force: true });
  }
}

/** White on a dark corner, black on a light one: the mean luminance where the bar goes decides. */
async function contrastingColour(panelPng: Buffer, box: { width: number; height: number }, position: string): Promise<'white' | 'black'> {
  const w = Math.max(1, Math.round(box.width * 0.3));
  const h = Math.max(1, Math.round(box.height * 0.15));
  const left = position.endsWith('right') ? box.width - w : 0;
  const top = position.startsWith('bottom') ? box.height - h : 0;
  const { channels } = await sharp(panelPng).extract({ left, top, width: w, height: h }).stats();
  const mean = channels.slice(0, 3).reduce((a, c) => a + c.mean, 0) / Math.min(3, channels.length);
  return mean < 128 ? 'white' : 'black';
}
