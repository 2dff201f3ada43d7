import { pipeline } from 'node:stream/promises';
import type { Request, RequestHandler, Response } from 'express';
import type { AppContext } from '../app-context';
import { AppError } from '../http/app-error';
import type { Image } from './image.entity';
import { DERIVATIVES_VERSION, imageKeys } from './image-keys';
import { ImagesService } from './images.service';
import { deepZoomDescriptor, iiifInfo, tileForIiifRequest } from './iiif';

/** Files never change at their URL (originals are kept as they are; derivatives are a function of them). */
const IMMUTABLE = 'private, max-age=31536000, immutable';
const CONTENT_TYPES = { tiff: 'image/tiff', png: 'image/png', jpeg: 'image/jpeg', webp: 'image/webp' } as const;

const param = (req: Request, name: string) => String(req.params[name]);

/** Thumbnails, previews, tiles, IIIF and Deep Zoom descriptors, and the original download. */
export class ImageFilesController {
  private readonly images: ImagesService;

  constructor(private readonly ctx: AppContext) {
    this.images = new ImagesService(ctx);
  }

  thumbnail: RequestHandler = async (req, res) => {
    const image = await this.ready(req);
    await this.send(req, res, imageKeys.thumbnail(image.projectId, image.id), 'image/jpeg', derivedTag(image, 'thumbnail'));
  };

  preview: RequestHandler = async (req, res) => {
    const image = await this.ready(req);
    await this.send(req, res, imageKeys.preview(image.projectId, image.id), 'image/jpeg', derivedTag(image, 'preview'));
  };

  tile: RequestHandler = async (req, res) => {
    const image = await this.ready(req);
    const m = /^(\d+)_(\d+)\.jpg$/.exec(param(req, 'tile'));
    const level = Number(param(req, 'level'));
    if (!m || !Number.isInteger(level)) throw AppError.notFound('The tile');
    const [column, row] = [Number(m[1]), Number(m[2])];
    await this.send(req, res, imageKeys.tile(image.projectId, image.id, level, column, row), 'image/jpeg', derivedTag(image, `${level}/${column}_${row}`));
  };

  deepZoom: RequestHandler = async (req, res) => {
    const image = await this.ready(req);
    res.setHeader('Cache-Control', IMMUTABLE);
    res.type('application/xml').send(deepZoomDescriptor(image.width, image.height));
  };

  iiifInfo: RequestHandler = async (req, res) => {
    const image = await this.ready(req);
    // The id is where this request came from, so the service works behind any host name.
    const id = `${req.protocol}://${req.get('host')}${req.baseUrl}/${image.id}/iiif`;
    res.setHeader('Cache-Control', 'private, max-age=3600');
    // IIIF Image API 3.0, §5: info.json with the JSON-LD media type and the profile link.
    res.type('application/ld+json; profile="http://iiif.io/api/image/3/context.json"').send(JSON.stringify(iiifInfo(id, image.width, image.height)));
  };

  iiifTile: RequestHandler = async (req, res) => {
    const image = await this.ready(req);
    const [region, size, rotation, qualityFormat] = ['region', 'size', 'rotation', 'quality'].map((n) => param(req, n)) as [string, string, string, string];
    const tile = tileForIiifRequest(image.width, image.height, region, size, rotation, qualityFormat);
    if (!tile) throw new AppError(400, 'validation_failed', 'This IIIF service is level 0: ask only for the tiles and sizes its info.json lists.');
    await this.send(req, res, imageKeys.tile(image.projectId, image.id, tile.level, tile.column, tile.row), 'image/jpeg', derivedTag(image, `${tile.level}/${tile.column}_${tile.row}`));
  };

  original: RequestHandler = async (req, res) => {
    const image = await this.images.find(param(req, 'projectId'), param(req, 'imageId'));
    res.setHeader('Content-Disposition', attachment(image.originalName));
    await this.send(req, res, image.originalKey, CONTENT_TYPES[image.format], `"sha256-${image.sha256}"`);
  };

  private async ready(req: Request): Promise<Image> {
    const image = await this.images.find(param(req, 'projectId'), param(req, 'imageId'));
    if (image.state !== 'ready') {
      const why = image.state === 'failed' ? `processing failed: ${image.failureReason}` : `it is ${image.state} (${image.progress} %)`;
      throw new AppError(409, 'image_not_ready', `The image’s views are not made yet: ${why}.`);
    }
    return image;
  }

  /** Streams an object with caching headers; answers 304 when the client's copy is current. */
  private async send(req: Request, res: Response, key: string, type: string, etag: string): Promise<void> {
    res.setHeader('ETag', etag);
    res.setHeader('Cache-Control', IMMUTABLE);
    if (matchesEtag(req.get('if-none-match'), etag)) {
      res.status(304).end();
      return;
    }
    const stat = await this.ctx.files.stat(key);
    const stream = stat && (await this.ctx.files.get(key));
    if (!stat || !stream) throw AppError.notFound('The file');
    res.type(type);
    res.setHeader('Content-Length', String(stat.size));
    try {
      await pipeline(stream, res);
    } catch {
      // The client went away mid-download; there is nobody left to answer.
    }
  }
}

/** RFC 9110 §13.1.2: If-None-Match lists entity tags (weak comparison) or is "*". */
function matchesEtag(header: string | undefined, etag: string): boolean {
  if (!header) return false;
  const bare = (t: string) => t.trim().replace(/^W\//, '');
  return header.trim() === '*' || header.split(',').some((t) => bare(t) === bare(etag));
}

function derivedTag(image: Image, what: string): string {
  return `"${image.sha256.slice(0, 32)}-v${DERIVATIVES_VERSION}-${what.replace(/[^\w/.-]/g, '')}"`;
}

/**
 * RFC 6266 attachment with the name twice: an ASCII fallback with anything risky replaced, and the
 * exact name percent-encoded (RFC 8187). Neither can carry a quote, CR or LF into the header.
 */
export function attachment(name: string): string {
  const fallback = name.replace(/[^\x20-\x7e]|["\\%;]/g, '_');
  const encoded = encodeURIComponent(name).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
  return `attachment; filename="${fallback}"; filename*=UTF-8''${encoded}`;
}
