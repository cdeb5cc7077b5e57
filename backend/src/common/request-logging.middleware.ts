import { Injectable, Logger, type NestMiddleware } from '@nestjs/common';
import type { NextFunction, Request, Response } from 'express';

/**
 * Path segments that look like secrets (one-time link tokens such as `<uuid>.<secret>`, viewing-link
 * tokens) are replaced by `:secret`; plain UUIDs stay readable.
 */
export function redactPath(path: string): string {
  return path
    // A viewing-link token is the whole point of /api/view/<token>: never log it, whatever its length.
    .replace(/^(\/api\/view\/)[^/]+/i, '$1:token')
    .split('/')
    .map((segment) => {
      const decoded = safeDecode(segment);
      const isUuid = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(decoded);
      return !isUuid && decoded.length >= 24 ? ':secret' : segment;
    })
    .join('/');
}

function safeDecode(segment: string): string {
  try {
    return decodeURIComponent(segment);
  } catch {
    return segment;
  }
}

/**
 * One structured line per request: method, path (query string dropped, since viewing-link
 * and reset tokens may travel there, and secret-looking segments redacted), status, duration
 * and user id when known.
 */
@Injectable()
export class RequestLoggingMiddleware implements NestMiddleware {
  private readonly logger = new Logger('http');

  use(req: Request, res: Response, next: NextFunction): void {
    const started = process.hrtime.bigint();
    // 'close' rather than 'finish': a live stream (server-sent events) that the client ends never finishes.
    res.on('close', () => {
      const ms = Number(process.hrtime.bigint() - started) / 1e6;
      const user = (req as Request & { user?: { id?: string } }).user?.id;
      this.logger.log({
        method: req.method,
        path: redactPath(req.originalUrl.split('?')[0]),
        status: res.statusCode,
        ms: Math.round(ms * 10) / 10,
        ...(user ? { user } : {}),
      });
    });
    next();
  }
}
