import type { z } from 'zod';
import { AppError } from './errors';

/** The client's address as the nearest proxy reports it; good enough to count requests, not to trust. */
export function clientIp(headers: Headers): string {
  const forwarded = headers.get('x-forwarded-for')?.split(',')[0]?.trim();
  return headers.get('x-real-ip') ?? (forwarded || '127.0.0.1');
}

/** Reads a form or JSON body and parses it; bad input becomes a 400/415 AppError naming each field. */
export async function parseBody<S extends z.ZodType>(request: Request, schema: S): Promise<z.infer<S>> {
  const type = request.headers.get('content-type') ?? '';
  let raw: unknown;
  try {
    if (type.startsWith('application/json')) raw = await request.json();
    else if (type.startsWith('application/x-www-form-urlencoded') || type.startsWith('multipart/form-data')) {
      raw = Object.fromEntries(await request.formData());
    } else {
      throw new AppError('unsupported_media_type', 'Send the request as JSON or as a form.', 415);
    }
  } catch (error) {
    if (error instanceof AppError) throw error;
    throw new AppError('malformed_body', 'The request body could not be read: check that it is valid JSON or form data.', 400);
  }
  const parsed = schema.safeParse(raw);
  if (!parsed.success) {
    const fields: Record<string, string[]> = {};
    for (const issue of parsed.error.issues) (fields[String(issue.path[0] ?? 'body')] ??= []).push(issue.message);
    const first = parsed.error.issues[0]?.message ?? 'Check the fields and try again.';
    throw new AppError('invalid_input', first, 400, { fields });
  }
  return parsed.data;
}
