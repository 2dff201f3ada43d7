import { Router } from 'express';
import type { PassportStatic } from 'passport';
import { changePasswordBody, checkResetBody, completeResetBody, requestResetBody, signInBody } from '../../shared/auth';
import type { AppContext } from '../app-context';
import { requireSignedIn } from '../http/require-auth';
import { validate } from '../http/validate';
import { AuthController } from './auth.controller';
import { resetRequestLimiter, signInLimiter } from './sign-in-limits';

export function authRouter(ctx: AppContext, passport: PassportStatic): Router {
  const controller = new AuthController(ctx, passport);
  const router = Router();
  router.get('/session', controller.session);
  router.post('/sign-in', signInLimiter(ctx.config.signInLimit), validate({ body: signInBody }), controller.signIn);
  router.post('/sign-out', requireSignedIn, controller.signOut);
  router.post('/password', requireSignedIn, validate({ body: changePasswordBody }), controller.changePassword);
  router.post('/password-reset', resetRequestLimiter(ctx.config.signInLimit), validate({ body: requestResetBody }), controller.requestReset);
  // Public like the two above: the page of an e-mailed link asks before anyone types a password.
  router.post('/password-reset/check', validate({ body: checkResetBody }), controller.checkReset);
  router.post('/password-reset/complete', validate({ body: completeResetBody }), controller.completeReset);
  return router;
}
