import { Router } from 'express';
import type { HealthReport } from '../../shared/health';
import type { AppContext } from '../app-context';

const VERSION = '0.1.0';

/** Public and session-free, so it answers even when the session store (the database) is down. */
export function healthRouter(ctx: AppContext): Router {
  const router = Router();
  router.get('/', async (_req, res) => {
    const up = await ctx.dataSource
      .query('SELECT 1')
      .then(() => true)
      .catch(() => false);
    const report: HealthReport = { status: up ? 'ok' : 'degraded', database: up ? 'up' : 'down', version: VERSION, mode: ctx.config.mode };
    res.status(up ? 200 : 503).json(report);
  });
  return router;
}
