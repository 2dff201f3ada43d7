import type { SessionUser } from '../../shared/auth';

declare global {
  namespace Express {
    /** What passport puts on `req.user`: reloaded from the database on every request. */
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SessionUser {}
  }
}
export {};
