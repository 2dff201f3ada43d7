import path from 'node:path';
import express, { type Express } from 'express';
import helmet from 'helmet';
import { activityRouter } from './activity/activity.routes';
import { adminRouter } from './admin/admin.routes';
import { alignmentsRouter } from './alignments/alignments.routes';
import { annotationsRouter } from './annotations/annotations.routes';
import { archiveRouter } from './archive/archive.routes';
import type { AppContext } from './app-context';
import { authRouter } from './auth/auth.routes';
import { calibrationRouter } from './calibration/calibration.routes';
import { createPassport } from './auth/passport-setup';
import { exportsRouter } from './exports/exports.routes';
import { figuresRouter } from './figures/figures.routes';
import { healthRouter } from './health/health.routes';
import { imagesRouter } from './images/images.routes';
import { measurementsRouter } from './measurements/measurements.routes';
import { notificationSettingsRouter } from './notifications/notification-settings.routes';
import { requireCsrfToken } from './http/csrf';
import { apiNotFound, errorHandler } from './http/error-handler';
import { requestLogger } from './http/request-logger';
import { sessionMiddleware } from './http/session';
import { viewerPage } from './http/viewer-preload';
import { projectsRouter } from './projects/projects.routes';
import { reviewQueueRouter, reviewsRouter } from './reviews/reviews.routes';
import { VIEWER_PATH } from '../shared/viewer/viewer-path';

/** Builds the Express app for a context; never listens (main.ts and tests do). */
export function createApp(ctx: AppContext): Express {
  const app = express();
  const passport = createPassport(ctx.dataSource);
  app.disable('x-powered-by');
  app.set('trust proxy', ctx.config.local ? false : 1);
  app.use(helmet({ contentSecurityPolicy: { useDefaults: false, directives: contentSecurityPolicy() }, hsts: !ctx.config.local }));
  app.use(requestLogger(ctx.logger));

  // Health first: it needs no session, so it answers while the session store is down.
  app.use('/api/health', healthRouter(ctx));

  const api = express.Router();
  api.use(express.json({ limit: ctx.config.jsonLimit, strict: true }));
  api.use(sessionMiddleware(ctx.config, ctx.dataSource));
  api.use(passport.initialize());
  api.use(passport.session());
  api.use(requireCsrfToken);
  api.use('/auth', authRouter(ctx, passport));
  api.use('/projects', projectsRouter(ctx));
  api.use('/projects/:projectId', archiveRouter(ctx));
  // Before the images router, whose '/:imageId' routes would otherwise see '/:imageId/annotations' first.
  api.use('/projects/:projectId', annotationsRouter(ctx));
  api.use('/projects/:projectId', calibrationRouter(ctx));
  api.use('/projects/:projectId', alignmentsRouter(ctx));
  api.use('/projects/:projectId', measurementsRouter(ctx));
  api.use('/projects/:projectId', activityRouter(ctx));
  api.use('/projects/:projectId', figuresRouter(ctx));
  api.use('/projects/:projectId', exportsRouter(ctx));
  api.use('/projects/:projectId', reviewsRouter(ctx));
  api.use('/projects/:projectId/images', imagesRouter(ctx));
  api.use('/admin', adminRouter(ctx));
  api.use('/review-queue', reviewQueueRouter(ctx));
  api.use('/me/notification-settings', notificationSettingsRouter(ctx));
  api.use(apiNotFound);
  app.use('/api', api);

  serveClient(app, ctx.config.clientDir);
  app.use(errorHandler);
  return app;
}

/** The built Angular app: hashed files cached for a year, index.html never, and every other path is a client route. */
function serveClient(app: Express, clientDir: string): void {
  app.use(
    express.static(clientDir, {
      index: false,
      setHeaders: (res, file) => {
        const hashed = /-[A-Z0-9]{8,}\.(js|css)$/.test(file) || file.includes(`${path.sep}media${path.sep}`);
        res.setHeader('Cache-Control', hashed ? 'public, max-age=31536000, immutable' : 'no-cache');
      },
    }),
  );
  app.get('/{*splat}', (req, res) => {
    // A missing file (an old chunk after a redeploy) is a 404, not the app page served as a script.
    if (path.extname(req.path)) {
      res.status(404).type('text').send('Not found.');
      return;
    }
    res.setHeader('Cache-Control', 'no-cache');
    const viewer = VIEWER_PATH.test(req.path) ? viewerPage(clientDir) : null;
    if (viewer) {
      res.type('html').send(viewer);
      return;
    }
    res.sendFile(path.join(clientDir, 'index.html'), (err) => {
      if (err) res.status(503).type('text').send('The client is not built yet. Run `npm start`, which builds it.');
    });
  });
}

/** Same-origin everything: the page may load nothing from another host. */
function contentSecurityPolicy() {
  return {
    'default-src': ["'self'"],
    'script-src': ["'self'"],
    // Angular inserts component styles as <style> elements.
    'style-src': ["'self'", "'unsafe-inline'"],
    'font-src': ["'self'", 'data:'],
    'img-src': ["'self'", 'data:', 'blob:'],
    'connect-src': ["'self'"],
    'object-src': ["'none'"],
    'base-uri': ["'self'"],
    'form-action': ["'self'"],
    'frame-ancestors': ["'none'"],
  };
}
