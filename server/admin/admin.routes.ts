import { Router } from 'express';
import { inviteUserBody, listUsersQuery, updateUserBody, userIdParams } from '../../shared/admin';
import type { AppContext } from '../app-context';
import { requireSignedIn, requireSiteAdmin } from '../http/require-auth';
import { validate } from '../http/validate';
import { AdminController } from './admin.controller';

export function adminRouter(ctx: AppContext): Router {
  const c = new AdminController(ctx);
  const router = Router();
  router.use(requireSignedIn, requireSiteAdmin);
  router.get('/users', validate({ query: listUsersQuery }), c.listUsers);
  router.post('/users', validate({ body: inviteUserBody }), c.inviteUser);
  router.patch('/users/:userId', validate({ params: userIdParams, body: updateUserBody }), c.updateUser);
  router.post('/users/:userId/reset', validate({ params: userIdParams }), c.sendReset);
  router.get('/mail', c.mail);
  return router;
}
