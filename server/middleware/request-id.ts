// Gives every request an id (echoed as X-Request-Id) and a child logger carrying it.
import { randomUUID } from 'node:crypto';
import type { RequestHandler } from 'express';
import type { Logger } from '../logger';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      id: string;
      log: Logger;
    }
  }
}

const SAFE_ID = /^[A-Za-z0-9._-]{8,64}$/;

/** The path without its query, with one-time tokens (long base64url segments) masked: never log a secret. */
export function loggablePath(url: string): string {
  return (url.split('?')[0] ?? '').replace(/[A-Za-z0-9_-]{20,}/g, ':token');
}

/** Attaches req.id (a trusted incoming X-Request-Id, else a new UUID) and req.log. */
export function requestId(logger: Logger): RequestHandler {
  return (req, res, next) => {
    const incoming = req.get('x-request-id');
    req.id = incoming && SAFE_ID.test(incoming) ? incoming : randomUUID();
    req.log = logger.child({ requestId: req.id });
    res.setHeader('X-Request-Id', req.id);
    const started = process.hrtime.bigint();
    res.on('finish', () => {
      const ms = Number(process.hrtime.bigint() - started) / 1e6;
      req.log.debug('request', {
        method: req.method,
        path: loggablePath(req.originalUrl),
        status: res.statusCode,
        ms: Math.round(ms),
        userId: req.user?.id,
      });
    });
    next();
  };
}
