import { HttpErrorResponse } from '@angular/common/http';

/** The API's error codes the client switches on (server/lib/errors.ts). */
export type ApiErrorCode =
  | 'bad_request' | 'validation_failed' | 'unauthenticated' | 'token_expired' | 'forbidden' | 'not_found'
  | 'conflict' | 'payload_too_large' | 'unsupported_media_type' | 'rate_limited' | 'internal' | 'offline';

/** An API refusal as the screens show it. */
export interface ApiProblem {
  readonly status: number;
  readonly code: ApiErrorCode;
  readonly message: string;
  readonly details: readonly { path: string; message: string }[];
}

/** Reads `{error: {code, message, details}}`, or says the server could not be reached. */
export function toApiProblem(error: unknown): ApiProblem {
  if (error instanceof HttpErrorResponse) {
    if (error.status === 0) {
      return { status: 0, code: 'offline', message: 'No connection to the server. Try again when the phone has signal.', details: [] };
    }
    const body = error.error as { error?: { code?: ApiErrorCode; message?: string; details?: unknown } } | null;
    const details = Array.isArray(body?.error?.details) ? (body.error.details as ApiProblem['details']) : [];
    return {
      status: error.status,
      code: body?.error?.code ?? 'internal',
      message: body?.error?.message ?? `The server answered ${error.status}`,
      details,
    };
  }
  return { status: 0, code: 'internal', message: error instanceof Error ? error.message : 'Something went wrong', details: [] };
}
