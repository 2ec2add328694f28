import type { ErrorRequestHandler, RequestHandler } from 'express';
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
