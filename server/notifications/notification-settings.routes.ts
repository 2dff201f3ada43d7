import { Router, type RequestHandler } from 'express';
import { notificationSettingsBody, type NotificationSettingsBody } from '../../shared/notifications';
import type { AppContext } from '../app-context';
import { currentUser, requireSignedIn } from '../http/require-auth';
import { validate } from '../http/validate';
import { NotificationSettingsService } from './notification-settings.service';

/** HTTP in, service call, HTTP out: always the caller's own settings, so there is no id to guess. */
class NotificationSettingsController {
  private readonly settings: NotificationSettingsService;

  constructor(ctx: AppContext) {
    this.settings = new NotificationSettingsService(ctx);
  }

  get: RequestHandler = async (req, res) => {
    res.json(await this.settings.get(currentUser(req).id));
  };
  put: RequestHandler = async (req, res) => {
    res.json(await this.settings.put(currentUser(req).id, req.body as NotificationSettingsBody));
  };
}

/** Mounted at /api/me/notification-settings; any signed-in person, whatever their roles. */
export function notificationSettingsRouter(ctx: AppContext): Router {
  const c = new NotificationSettingsController(ctx);
  const router = Router();
  router.use(requireSignedIn);
  router.get('/', c.get);
  router.put('/', validate({ body: notificationSettingsBody }), c.put);
  return router;
}
