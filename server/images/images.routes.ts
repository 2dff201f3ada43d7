import { Router } from 'express';
import { iiifParams, imageParams, searchImagesQuery, tileParams, updateImageBody, uploadFields } from '../../shared/images';
import { projectIdParams } from '../../shared/projects';
import type { ProjectAction } from '../../shared/roles';
import type { AppContext } from '../app-context';
import { requireSignedIn } from '../http/require-auth';
import { validate } from '../http/validate';
import { requireProjectAction } from '../projects/project-access';
import { ImageFilesController } from './image-files.controller';
import { ImagesController } from './images.controller';
import { receiveOneFile, removeUploadOnError } from './upload-middleware';

/**
 * Mounted at /api/projects/:projectId/images; each line: params checked, then the role, then the
 * body. The role is checked before a single byte of an upload is read.
 */
export function imagesRouter(ctx: AppContext): Router {
  const c = new ImagesController(ctx);
  const f = new ImageFilesController(ctx);
  const may = (action: ProjectAction) => requireProjectAction(ctx.dataSource, action);
  const one = validate({ params: imageParams });
  const router = Router({ mergeParams: true });
  router.use(requireSignedIn);

  router.get('/', validate({ params: projectIdParams, query: searchImagesQuery }), may('read'), c.search);
  router.post('/', validate({ params: projectIdParams }), may('upload'), receiveOneFile(ctx), validate({ body: uploadFields }), c.upload);
  router.get('/:imageId', one, may('read'), c.detail);
  router.patch('/:imageId', one, may('editMetadata'), validate({ body: updateImageBody }), c.update);
  router.delete('/:imageId', one, may('delete'), c.remove);
  router.post('/:imageId/retry', one, may('upload'), c.retry);

  router.get('/:imageId/original', one, may('read'), f.original);
  router.get('/:imageId/thumbnail', one, may('read'), f.thumbnail);
  router.get('/:imageId/preview', one, may('read'), f.preview);
  router.get('/:imageId/tiles.dzi', one, may('read'), f.deepZoom);
  router.get('/:imageId/tiles/:level/:tile', validate({ params: tileParams }), may('read'), f.tile);
  router.get('/:imageId/iiif/info.json', one, may('read'), f.iiifInfo);
  router.get('/:imageId/iiif/:region/:size/:rotation/:quality', validate({ params: iiifParams }), may('read'), f.iiifTile);

  router.use(removeUploadOnError);
  return router;
}
