/**
 * The domain's one error type. `code` is stable and machine-readable, `message` is safe to show a
 * person and says what to do, `status` is the HTTP status the API answers with.
 */
export class AppError extends Error {
  constructor(
    public readonly code: string,
    message: string,
    public readonly status: number,
    public readonly details?: Record<string, unknown>,
    public readonly retryAfterSeconds?: number,
  ) {
    super(message);
    this.name = 'AppError';
  }
}

export type ErrorBody = { error: { code: string; message: string; details?: Record<string, unknown> } };

/** The API's one JSON error shape, with `Retry-After` where the caller should come back later. */
export function errorResponse(error: AppError): Response {
  const body: ErrorBody = { error: { code: error.code, message: error.message } };
  if (error.details) body.error.details = error.details;
  const headers = new Headers({ 'Cache-Control': 'no-store' });
  if (error.retryAfterSeconds !== undefined) headers.set('Retry-After', String(error.retryAfterSeconds));
  return Response.json(body, { status: error.status, headers });
}

/** Anything that is not an AppError becomes a generic 500 with a log line, never a stack trace. */
export function toErrorResponse(error: unknown): Response {
  if (error instanceof AppError) return errorResponse(error);
  console.error('Unexpected error while answering a request', error);
  return errorResponse(
    new AppError('internal_error', 'Something went wrong on our side. Please try again in a moment.', 500),
  );
}
