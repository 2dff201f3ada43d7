import type { RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { Config } from '../config';
import { AppError } from '../http/app-error';

function minutesUntil(reset: Date | undefined): number {
  return reset ? Math.max(1, Math.ceil((reset.getTime() - Date.now()) / 60_000)) : 1;
}

function bodyEmail(body: unknown): string {
  const email = (body as { email?: unknown } | undefined)?.email;
  return typeof email === 'string' ? email.trim().toLowerCase() : '';
}

/**
 * Failed sign-ins per address and account: guessing one account's password is slowed
 * without locking its owner out from another machine. Successful sign-ins do not count.
 */
export function signInLimiter(limit: Config['signInLimit']): RequestHandler {
  return rateLimit({
    windowMs: limit.windowMs,
    limit: limit.max,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${bodyEmail(req.body)}`,
    handler: (req, _res, next) => {
      const wait = minutesUntil((req as { rateLimit?: { resetTime?: Date } }).rateLimit?.resetTime);
      next(new AppError(429, 'too_many_requests', `Too many failed sign-in attempts for this account. Wait ${wait} minute${wait > 1 ? 's' : ''} and try again, or reset your password.`));
    },
  });
}

/** Reset e-mails per address, so the form cannot be used to flood someone's inbox. */
export function resetRequestLimiter(limit: Config['signInLimit']): RequestHandler {
  return rateLimit({
    windowMs: limit.windowMs,
    limit: limit.max,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${bodyEmail(req.body)}`,
    handler: (req, _res, next) => {
      const wait = minutesUntil((req as { rateLimit?: { resetTime?: Date } }).rateLimit?.resetTime);
      next(new AppError(429, 'too_many_requests', `Too many reset requests for this address. Wait ${wait} minute${wait > 1 ? 's' : ''} and try again.`));
    },
  });
}
