import { describe, expect, it, vi } from 'vitest';
import { AppError, errorResponse, toErrorResponse } from '@/lib/api/errors';

describe('the API error shape', () => {
  it('answers { error: { code, message, details } } with the status and Retry-After', async () => {
    const response = errorResponse(
      new AppError('database_unavailable', 'Try again in a few seconds.', 503, { database: 'down' }, 5),
    );
    expect(response.status).toBe(503);
    expect(response.headers.get('Retry-After')).toBe('5');
    expect(response.headers.get('Content-Type')).toMatch(/^application\/json/);
    expect(await response.json()).toEqual({
      error: { code: 'database_unavailable', message: 'Try again in a few seconds.', details: { database: 'down' } },
    });
  });

  it('turns an unexpected error into a generic 500 without its message or stack', async () => {
    const log = vi.spyOn(console, 'error').mockImplementation(() => {});
    const response = toErrorResponse(new Error('relation "secret_table" does not exist'));
    const body = await response.text();
    expect(response.status).toBe(500);
    expect(body).not.toMatch(/secret_table|at .*\.ts/);
    expect(JSON.parse(body).error.code).toBe('internal_error');
    expect(log).toHaveBeenCalledOnce();
    log.mockRestore();
  });
});
