import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { Logger } from 'pino';
import { ZodError } from 'zod';

/** Machine-readable error codes the API answers with; the client switches on these. */
export type ErrorCode =
  | 'bad_request'
  | 'validation_failed'
  | 'unauthenticated'
  | 'token_expired'
  | 'forbidden'
  | 'not_found'
  | 'conflict'
  | 'payload_too_large'
  | 'unsupported_media_type'
  | 'rate_limited'
  | 'internal';

const STATUS_BY_CODE: Record<ErrorCode, number> = {
  bad_request: 400,
  validation_failed: 400,
  unauthenticated: 401,
  token_expired: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  payload_too_large: 413,
  unsupported_media_type: 415,
  rate_limited: 429,
  internal: 500,
};

/** An error the API reports to the caller as `{error: {code, message, details}}`. */
export class AppError extends Error {
  readonly status: number;

  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'AppError';
    this.status = STATUS_BY_CODE[code];
  }
}

/** Turns zod issues into the `details` list the API returns: where, and what is wrong. */
export function describeZodError(error: ZodError): { path: string; message: string }[] {
  return error.issues.map((issue) => ({ path: issue.path.join('.'), message: issue.message }));
}

/** Answers 404 in the API's error format for /api routes nobody handles. */
export const apiNotFound: RequestHandler = (request, _response, next) => {
  next(new AppError('not_found', `No API route for ${request.method} ${request.originalUrl.split("?")[0]}`));
};

/**
 * The one error handler, last in the chain. Known errors keep their code; body-parser and zod
 * errors become 4xx; anything else is logged and answered as a bare 500 with no stack trace.
 */
export function errorMiddleware(logger: Logger): ErrorRequestHandler {
  return (error: unknown, _request, response, next) => {
    if (response.headersSent) {
      next(error);
      return;
    }
    const appError = toAppError(error);
    if (appError.status >= 500) {
      logger.error({ err: error }, 'unhandled error');
    }
    response.status(appError.status).json({
      error: { code: appError.code, message: appError.message, details: appError.details ?? null },
    });
  };
}

function toAppError(error: unknown): AppError {
  if (error instanceof AppError) {
    return error;
  }
  if (error instanceof ZodError) {
    return new AppError('validation_failed', 'The request is not valid', describeZodError(error));
  }
  const httpError = error as { type?: string; status?: number; statusCode?: number; message?: string };
  const status = httpError.status ?? httpError.statusCode;
  if (httpError.type === 'entity.parse.failed') {
    return new AppError('bad_request', 'The request body is not valid JSON');
  }
  if (httpError.type === 'entity.too.large' || status === 413) {
    return new AppError('payload_too_large', 'The request body is too large');
  }
  if (httpError.type === 'encoding.unsupported' || httpError.type === 'charset.unsupported') {
    return new AppError('unsupported_media_type', 'The request encoding is not supported');
  }
  if (typeof status === 'number' && status >= 400 && status < 500) {
    return new AppError('bad_request', httpError.message ?? 'Bad request');
  }
  return new AppError('internal', 'Something went wrong on the server');
}
