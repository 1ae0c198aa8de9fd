import { cookies } from 'next/headers';
import { AppError, toErrorResponse } from '@/lib/api/errors';
import { parseBody } from '@/lib/api/request';
import { startDemoSession } from '@/lib/auth/demo';
import { sessionCookieName } from '@/lib/auth/options';
import { demoSignInSchema } from '@/lib/auth/schemas';
import { getEnv } from '@/lib/env';

/** Demo mode only: sign in as one of the seeded demo people with one click. Elsewhere this is a 404. */
export async function POST(request: Request): Promise<Response> {
  try {
    const env = getEnv();
    if (!env.DEMO_MODE) throw new AppError('not_found', 'There is no such page.', 404);
    // A form on another site must not be able to sign a visitor in as someone else.
    const origin = request.headers.get('origin');
    if (origin && origin !== new URL(env.APP_URL).origin) {
      throw new AppError('cross_site', 'Sign in from the Demold sign-in page itself.', 403);
    }
    const input = await parseBody(request, demoSignInSchema);
    const { sessionToken, expires } = await startDemoSession(input.email);
    (await cookies()).set(sessionCookieName(), sessionToken, {
      httpOnly: true,
      sameSite: 'lax',
      path: '/',
      secure: env.APP_URL.startsWith('https://'),
      expires,
    });
    return Response.json({ url: input.callbackUrl ?? '/' }, { headers: { 'Cache-Control': 'no-store' } });
  } catch (error) {
    return toErrorResponse(error);
  }
}
