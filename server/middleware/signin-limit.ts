// Sign-in rate limits: failures per client IP + lower-cased e-mail (guessing one person's password),
// stacked with failures per client IP across every address (password spraying: a few guesses at
// many addresses). Only failed attempts count, so a shop signing many people in from one address
// (or a test suite) is never throttled.
import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';

/** Client IP (IPv6 folded to its /56 subnet by express-rate-limit) + the lower-cased e-mail of the body. */
function ipAndEmailKey(req: Request): string {
  const email = typeof req.body?.email === 'string' ? req.body.email.trim().toLowerCase() : '';
  return `${ipKeyGenerator(req.ip ?? '')}|${email}`;
}

/** A limiter of failed sign-ins only: `maxFailures` per key per `windowMin` minutes, then 429 `too_many_attempts`. */
function failedSignInLimit(maxFailures: number, windowMin: number, keyGenerator: (req: Request) => string, message: string): RequestHandler {
  return rateLimit({
    windowMs: windowMin * 60_000,
    limit: maxFailures,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator,
    handler: (_req, res) => {
      res.status(429).json({ error: { code: 'too_many_attempts', message } });
    },
  });
}

/** At most `maxFailures` failed sign-ins per IP + e-mail per `windowMin` minutes; then 429 `too_many_attempts`. */
export function signInLimit(maxFailures: number, windowMin: number): RequestHandler {
  return failedSignInLimit(maxFailures, windowMin, ipAndEmailKey,
    `Too many failed sign-ins for this address; wait ${windowMin} minutes or reset your password`);
}

/**
 * At most `maxFailures` failed sign-ins per client IP (IPv6 by /56 subnet) across all e-mail
 * addresses per `windowMin` minutes; then 429 `too_many_attempts`. Runs before the per-address
 * limit, so spraying 30 addresses × 9 guesses from one IP stops at `maxFailures`. Generous by
 * default (100 per 15 minutes) because a whole shop may sign in from one address.
 */
export function signInIpLimit(maxFailures: number, windowMin: number): RequestHandler {
  return failedSignInLimit(maxFailures, windowMin, (req) => ipKeyGenerator(req.ip ?? ''),
    `Too many failed sign-ins from this network; wait ${windowMin} minutes, or ask your admin to reset your password`);
}

/**
 * Password-reset requests per IP + e-mail: at most `max` per `windowMin` minutes (each one sends a
 * mail), then 429 `too_many_attempts`. Keeps the reset form from being used to flood an inbox.
 */
export function resetRequestLimit(max = 5, windowMin = 15): RequestHandler {
  return rateLimit({
    windowMs: windowMin * 60_000,
    limit: max,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: ipAndEmailKey,
    handler: (_req, res) => {
      res.status(429).json({
        error: { code: 'too_many_attempts', message: `Too many reset requests for this address; wait ${windowMin} minutes and check your mail` },
      });
    },
  });
}
