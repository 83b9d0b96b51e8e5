import { isUtf8 } from 'node:buffer';
import type { IncomingMessage, ServerResponse } from 'node:http';
import type { z } from 'zod';
import { AppError, describeZodError } from './errors';

/** Parses untrusted input with a zod schema, or throws a 400 that lists every problem. */
export function parseOrThrow<Schema extends z.ZodType>(schema: Schema, value: unknown, what = 'request'): z.infer<Schema> {
  const result = schema.safeParse(value);
  if (!result.success) {
    throw new AppError('validation_failed', `The ${what} is not valid`, describeZodError(result.error));
  }
  return result.data;
}

/**
 * The JSON parser's `verify` hook: refuses a body that is not valid UTF-8 with a 400, where the
 * parser would otherwise store U+FFFD in place of the bad bytes and answer as if all were well.
 */
export function refuseInvalidUtf8(_request: IncomingMessage, _response: ServerResponse, body: Buffer): void {
  if (!isUtf8(body)) {
    throw new AppError('bad_request', 'The request body is not valid UTF-8');
  }
}
