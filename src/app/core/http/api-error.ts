import type { ApiErrorBody } from '@shared/schemas/common';

/** Every failed HTTP call reaches components as one of these (see error.interceptor.ts). */
export class ApiError extends Error {
  override readonly name = 'ApiError';

  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: Record<string, string> = {},
    /** Anything else the server put in `error` (an import's `problems` list). */
    readonly details: Record<string, unknown> = {},
  ) {
    super(message);
  }
}

export function isApiErrorBody(body: unknown): body is ApiErrorBody {
  if (typeof body !== 'object' || body === null || !('error' in body)) return false;
  const error = (body as { error: unknown }).error;
  return (
    typeof error === 'object' &&
    error !== null &&
    typeof (error as { message?: unknown }).message === 'string' &&
    typeof (error as { code?: unknown }).code === 'string'
  );
}

/** A readable message for anything thrown, for snack bars and inline errors. */
export function messageOf(error: unknown): string {
  if (error instanceof ApiError) return error.message;
  return 'Something went wrong. Try again.';
}
