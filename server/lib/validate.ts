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
