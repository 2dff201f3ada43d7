import { Router } from 'express';
import { activityQuery, type ActivityEvent as ActivityEventDto, type ActivityQuery } from '../../shared/activity';
import type { Page } from '../../shared/paging';
import { projectIdParams } from '../../shared/projects';
import type { AppContext } from '../app-context';
import { requireSignedIn } from '../http/require-auth';
import { validate } from '../http/validate';
import { requireProjectAction } from '../projects/project-access';
import { ActivityEvent } from './activity-event.entity';

/** Mounted at /api/projects/:projectId: the project's history, or one image's, newest first. Read-only by design. */
export function activityRouter(ctx: AppContext): Router {
  const router = Router({ mergeParams: true });
  router.get('/activity', requireSignedIn, validate({ params: projectIdParams, query: activityQuery }), requireProjectAction(ctx.dataSource, 'read'), async (req, res) => {
    const q = req.query as unknown as ActivityQuery;
    const projectId = String(req.params['projectId']);
    const [rows, total] = await ctx.dataSource.getRepository(ActivityEvent).findAndCount({
      where: { projectId, ...(q.imageId ? { imageId: q.imageId } : {}) },
      relations: { actor: true },
      order: { seq: q.dir === 'asc' ? 'ASC' : 'DESC' },
      skip: q.page * q.pageSize,
      take: q.pageSize,
    });
    const items: ActivityEventDto[] = rows.map((e) => ({ id: e.id, at: e.at.toISOString(), actorName: e.actor.displayName, action: e.action, imageId: e.imageId, summary: e.summary }));
    const page: Page<ActivityEventDto> = { items, total, page: q.page, pageSize: q.pageSize };
    res.json(page);
  });
  return router;
}
