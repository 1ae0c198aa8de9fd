// Browser-side helpers for talking to our API: one place that understands the error shape.

export class ApiError extends Error {
  constructor(
    public readonly code: string,
    message: string,
    public readonly status: number,
    public readonly details?: Record<string, unknown>,
  ) {
    super(message);
  }
}

/** Reads a response; a non-2xx answer becomes an ApiError with the server's own message. */
export async function readApiResponse<T>(response: Response): Promise<T> {
  const body: unknown = await response.json().catch(() => null);
  if (response.ok) return body as T;
  const error = (body as { error?: { code?: string; message?: string; details?: Record<string, unknown> } } | null)?.error;
  throw new ApiError(
    error?.code ?? 'unexpected_response',
    error?.message ?? `The server answered ${response.status}. Please try again.`,
    response.status,
    error?.details,
  );
}

/** next-auth's CSRF token, which its POST endpoints require. */
export async function fetchCsrfToken(): Promise<string> {
  const { csrfToken } = await readApiResponse<{ csrfToken: string }>(await fetch('/api/auth/csrf', { cache: 'no-store' }));
  return csrfToken;
}

/** POSTs a form to one of next-auth's endpoints and returns where it says to go next. */
export async function postAuthForm(path: string, fields: Record<string, string>): Promise<{ url: string }> {
  const csrfToken = await fetchCsrfToken();
  const response = await fetch(path, {
    method: 'POST',
    headers: { 'Content-Type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({ ...fields, csrfToken, json: 'true' }),
  });
  return readApiResponse<{ url: string }>(response);
}
