import type { ErrorRequestHandler, RequestHandler } from 'express';
import { DATABASE_RETRY_AFTER_SECONDS, isDatabaseUnavailable } from './database-unavailable';
import { AppError } from './errors';
import type { Logger } from './logger';

export function notFoundHandler(): RequestHandler {
  return (req, _res, next) => {
    next(new AppError('not_found', 404, `No API route ${req.method} ${req.path}.`));
  };
}

/** Turns every error into `{ error: { code, message, details } }`; hides internals of the rest. */
export function errorHandler(logger: Logger): ErrorRequestHandler {
  return (error, req, res, _next) => {
    if (error instanceof AppError) {
      res.status(error.status).json({
        error: { code: error.code, message: error.message, details: error.details },
      });
      return;
    }
    if (isBodyParserError(error)) {
      res.status(error.status).json({
        error: { code: 'invalid_body', message: 'The request body could not be read as JSON.' },
      });
      return;
    }
    if (isDatabaseUnavailable(error)) {
      // An outage, not a bug: the client waits and tries again (Retry-After, RFC 9110 §10.2.3).
      logger.warn({ err: error, requestId: req.requestId, path: req.path }, 'database unavailable');
      if (res.headersSent) {
        res.end();
        return;
      }
      res.setHeader('Retry-After', String(DATABASE_RETRY_AFTER_SECONDS));
      res.status(503).json({
        error: {
          code: 'database_unavailable',
          message: 'The server cannot reach its database, retrying.',
          details: { retryAfterSeconds: DATABASE_RETRY_AFTER_SECONDS },
        },
      });
      return;
    }
    logger.error({ err: error, requestId: req.requestId, path: req.path }, 'request failed');
    res.status(500).json({
      error: {
        code: 'internal',
        message: `Something went wrong on our side. Quote reference ${req.requestId} if it persists.`,
      },
    });
  };
}

function isBodyParserError(error: unknown): error is { status: number; type: string } {
  return (
    typeof error === 'object' &&
    error !== null &&
    'type' in error &&
    'status' in error &&
    typeof (error as { status: unknown }).status === 'number' &&
    (error as { status: number }).status < 500
  );
}
