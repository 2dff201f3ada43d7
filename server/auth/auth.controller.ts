import type { Request, RequestHandler, Response } from 'express';
import type { PassportStatic } from 'passport';
import type { ChangePasswordBody, CheckResetBody, CompleteResetBody, RequestResetBody, SessionInfo } from '../../shared/auth';
import type { AppContext } from '../app-context';
import { DEMO_ACCOUNTS } from '../demo/demo-accounts';
import { AppError } from '../http/app-error';
import { csrfTokenFor, renewCsrfToken } from '../http/csrf';
import { currentUser } from '../http/require-auth';
import { saveSession, SESSION_COOKIE } from '../http/session';
import { AuthService } from './auth.service';
import type { SignInRefusal } from './passport-setup';

const REFUSALS: Record<SignInRefusal, AppError> = {
  bad_credentials: new AppError(401, 'bad_credentials', 'The e-mail address or password is wrong.'),
  account_inactive: new AppError(403, 'account_inactive', 'This account has been deactivated. Ask a site administrator.'),
};

/** HTTP in, service call, HTTP out for sign-in, sign-out and passwords. */
export class AuthController {
  private readonly service: AuthService;

  constructor(
    private readonly ctx: AppContext,
    private readonly passport: PassportStatic,
  ) {
    this.service = new AuthService(ctx);
  }

  session: RequestHandler = async (req, res) => {
    const csrfToken = csrfTokenFor(req);
    // A token is only worth handing out once it is stored; an unreachable store becomes a 503 here.
    await saveSession(req);
    res.json(this.sessionInfo(req, csrfToken));
  };

  signIn: RequestHandler = async (req, res) => {
    const user = await this.authenticate(req, res);
    // passport regenerates the session id here, so a planted pre-sign-in id is worthless.
    await new Promise<void>((resolve, reject) => req.logIn(user, (err) => (err ? reject(err) : resolve())));
    await this.service.recordSignIn(user.id);
    res.json(this.sessionInfo(req, renewCsrfToken(req)));
  };

  signOut: RequestHandler = async (req, res) => {
    await new Promise<void>((resolve, reject) => req.logOut((err) => (err ? reject(err) : resolve())));
    await new Promise<void>((resolve, reject) => req.session.destroy((err) => (err ? reject(err) : resolve())));
    res.clearCookie(SESSION_COOKIE).status(204).end();
  };

  changePassword: RequestHandler = async (req, res) => {
    await this.service.changePassword(currentUser(req).id, req.body as ChangePasswordBody, req.sessionID);
    res.status(204).end();
  };

  requestReset: RequestHandler = async (req, res) => {
    await this.service.requestReset((req.body as RequestResetBody).email);
    res.status(202).json({ message: 'If an account exists for that address, a link to set a new password is on its way.' });
  };

  checkReset: RequestHandler = async (req, res) => {
    await this.service.checkReset(req.body as CheckResetBody);
    res.status(204).end();
  };

  completeReset: RequestHandler = async (req, res) => {
    await this.service.completeReset(req.body as CompleteResetBody);
    res.status(204).end();
  };

  private sessionInfo(req: Request, csrfToken: string): SessionInfo {
    return { user: req.user ?? null, csrfToken, demoAccounts: this.ctx.config.local ? DEMO_ACCOUNTS : null };
  }

  private authenticate(req: Request, res: Response): Promise<Express.User> {
    return new Promise((resolve, reject) => {
      this.passport.authenticate('local', { session: false }, (err: unknown, user: Express.User | false, info?: { message?: string }) => {
        if (err) return reject(err);
        if (!user) return reject(REFUSALS[(info?.message as SignInRefusal) ?? 'bad_credentials'] ?? REFUSALS.bad_credentials);
        resolve(user);
      })(req, res, reject);
    });
  }
}
