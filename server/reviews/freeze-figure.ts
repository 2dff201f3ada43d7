import { createHash, randomUUID } from 'node:crypto';
import { mkdir, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import sharp from 'sharp';
import { In, type EntityManager } from 'typeorm';
import { DEFAULT_PRINT, type FigureSpec } from '../../shared/figures';
import type { ClearedPanelImage } from '../../shared/reviews';
import type { AppContext } from '../app-context';
import { renderFigure } from '../figures/figure-renderer';
import { Figure } from '../figures/figure.entity';
import { AppError } from '../http/app-error';
import { Image } from '../images/image.entity';
import { FigureClearance, type StoredClearedFile } from './figure-clearance.entity';

/** Both files a reviewer may be asked for: PNG for screens and slides, TIFF for print. */
const CLEARED_FORMATS = ['png', 'tiff'] as const;

/** The figure's stored spec with the print size filled in for figures saved before they carried one. */
export function specOf(figure: Figure): FigureSpec {
  return { title: figure.title, ...DEFAULT_PRINT, ...figure.spec };
}

/**
 * Refuses (409, nothing changed) a figure that shows an image no longer in the project: it can
 * neither be rendered nor stand for what a reviewer saw.
 */
export async function checkPanelImages(m: EntityManager, projectId: string, spec: Pick<FigureSpec, 'panels'>): Promise<void> {
  const found = new Set((await m.findBy(Image, { id: In(spec.panels.map((p) => p.imageId)), projectId })).map((i) => i.id));
  const missing = spec.panels.flatMap((p, i) => (found.has(p.imageId) ? [] : [p.letter || String(i + 1)]));
  if (missing.length > 0) {
    const which = missing.length === 1 ? `panel ${missing[0]}` : `panels ${missing.join(', ')}`;
    throw AppError.conflict(`The image of ${which} has been deleted; choose another image or remove the panel, save, and submit again.`);
  }
}

/**
 * Freezes what a reviewer cleared: the figure's definition, what its panels' images were, and the
 * export rendered now as PNG and TIFF at the figure's print size, each kept in the FileStore under
 * its SHA-256 (content-addressed: an identical render lands on the same key, nothing is rewritten).
 * Call it holding the figure's review-row lock, so an edit of a panel image is either drawn here or
 * returns the figure to draft after this commits. Files written before a rollback are harmless:
 * nothing names them, and their key is their content.
 */
export async function freezeFigure(ctx: AppContext, m: EntityManager, projectId: string, figureId: string, eventId: string, clearedBy: string): Promise<void> {
  const figure = await m.findOneByOrFail(Figure, { id: figureId, projectId });
  const spec = specOf(figure);
  await checkPanelImages(m, projectId, spec);
  const files: StoredClearedFile[] = [];
  for (const format of CLEARED_FORMATS) {
    const bytes = await renderFigure(ctx, m, projectId, spec, { format, widthMm: spec.widthMm, dpi: spec.dpi });
    const sha256 = createHash('sha256').update(bytes).digest('hex');
    const ext = format === 'png' ? 'png' : 'tif';
    const storageKey = `projects/${projectId}/figures/${figureId}/cleared/${sha256}.${ext}`;
    if (!(await ctx.files.stat(storageKey))) await putBytes(ctx, storageKey, bytes, format === 'png' ? 'image/png' : 'image/tiff');
    const { width, height } = await pixelSize(bytes);
    files.push({ format, widthMm: spec.widthMm, dpi: spec.dpi, width, height, byteSize: bytes.length, sha256, storageKey });
  }
  await m.save(
    m.create(FigureClearance, {
      figureId,
      projectId,
      eventId,
      figureVersion: figure.version,
      title: figure.title,
      definition: { ...spec } as unknown as Record<string, unknown>,
      images: await panelImages(m, projectId, spec),
      files,
      clearedBy,
    }),
  );
}

/** Each panel image once: its name, pixel size and how many of its annotations the figure draws. */
async function panelImages(m: EntityManager, projectId: string, spec: FigureSpec): Promise<ClearedPanelImage[]> {
  const ids = [...new Set(spec.panels.map((p) => p.imageId))];
  const images = new Map((await m.findBy(Image, { id: In(ids), projectId })).map((i) => [i.id, i]));
  const out: ClearedPanelImage[] = [];
  for (const id of ids) {
    const classIds = [...new Set(spec.panels.filter((p) => p.imageId === id).flatMap((p) => p.classIds))];
    const [row]: { n: number }[] = await m.query(`SELECT count(*)::int AS n FROM annotations WHERE image_id = $1 AND class_id = ANY($2::uuid[])`, [id, classIds]);
    const image = images.get(id)!;
    out.push({ imageId: id, name: image.originalName, pixelSizeUm: image.pixelSizeUm, annotationsShown: row?.n ?? 0 });
  }
  return out;
}

async function pixelSize(bytes: Buffer): Promise<{ width: number; height: number }> {
  const meta = await sharp(bytes).metadata();
  return { width: meta.width ?? 0, height: meta.height ?? 0 };
}

/** The FileStore takes files from disk; the render is in memory. */
async function putBytes(ctx: AppContext, key: string, bytes: Buffer, contentType: string): Promise<void> {
  const tmp = path.join(ctx.config.storageDir, 'tmp', 'figures', `${randomUUID()}-cleared`);
  await mkdir(path.dirname(tmp), { recursive: true });
  await writeFile(tmp, bytes);
  try {
    await ctx.files.putFile(key, tmp, contentType);
  } finally {
    await rm(tmp, { force: true });
  }
}
