import type { Request, RequestHandler } from 'express';
import { AppError } from './app-error';

/** Refuses requests without a signed-in user. */
export const requireSignedIn: RequestHandler = (req, _res, next) => {
  currentUser(req);
  next();
};

/** Refuses anyone who is not a site admin. */
export const requireSiteAdmin: RequestHandler = (req, _res, next) => {
  if (currentUser(req).siteRole !== 'admin') throw AppError.forbidden('Only site administrators may do this.');
  next();
};

/** The signed-in user, or a 401 for routes that forgot `requireSignedIn`. */
export function currentUser(req: Request): Express.User {
  if (!req.user) throw new AppError(401, 'not_signed_in', 'Sign in to continue.');
  return req.user;
}
