import { rm } from 'node:fs/promises';
import type { Request, RequestHandler } from 'express';
import type { SearchImagesQuery, UpdateImageBody, UploadFields } from '../../shared/images';
import type { AppContext } from '../app-context';
import { currentUser } from '../http/require-auth';
import { ImageIngestService } from './image-ingest.service';
import { ImagesSearchService } from './images-search.service';
import { ImagesService } from './images.service';
import type { HashedFile } from './ingest/hashing-disk-storage';

const param = (req: Request, name: string) => String(req.params[name]);

/** HTTP in, service call, HTTP out for image records. */
export class ImagesController {
  private readonly images: ImagesService;
  private readonly ingestion: ImageIngestService;
  private readonly searching: ImagesSearchService;

  constructor(ctx: AppContext) {
    this.images = new ImagesService(ctx);
    this.ingestion = new ImageIngestService(ctx);
    this.searching = new ImagesSearchService(ctx);
  }

  search: RequestHandler = async (req, res) => {
    res.json(await this.searching.search(param(req, 'projectId'), req.query as unknown as SearchImagesQuery));
  };

  upload: RequestHandler = async (req, res) => {
    const file = req.file as Express.Multer.File & HashedFile;
    try {
      const result = await this.ingestion.ingest(param(req, 'projectId'), currentUser(req).id, { ...file, originalName: file.originalname }, req.body as UploadFields);
      res.status(201).json(result);
    } finally {
      // The local store moves the file away; any other store leaves a copy to remove.
      await rm(file.path, { force: true });
    }
  };

  detail: RequestHandler = async (req, res) => {
    res.json(await this.images.detail(param(req, 'projectId'), param(req, 'imageId')));
  };

  update: RequestHandler = async (req, res) => {
    res.json(await this.images.update(param(req, 'projectId'), param(req, 'imageId'), req.body as UpdateImageBody, currentUser(req).id));
  };

  remove: RequestHandler = async (req, res) => {
    await this.images.remove(currentUser(req), param(req, 'projectId'), param(req, 'imageId'));
    res.status(204).end();
  };

  retry: RequestHandler = async (req, res) => {
    res.status(202).json(await this.images.retry(param(req, 'projectId'), param(req, 'imageId')));
  };
}
