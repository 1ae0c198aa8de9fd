import NextAuth from 'next-auth';
import type { NextRequest } from 'next/server';
import { AppError, toErrorResponse } from '@/lib/api/errors';
import { clientIp, parseBody } from '@/lib/api/request';
import { getAuthOptions } from '@/lib/auth/options';
import { consumeSignInAllowance } from '@/lib/auth/rate-limit';
import { signInEmailFormSchema } from '@/lib/auth/schemas';
import { inspectSignInLink } from '@/lib/auth/sign-in-link';
import { getEnv } from '@/lib/env';

type Context = { params: Promise<{ nextauth: string[] }> };

const linkProblems = { used: 'link_used', expired: 'link_expired', unknown: 'link_invalid' } as const;

// next-auth does the sign-in itself; around it we add what it lacks: our address rules and rate limits
// before a link is sent, and a precise reason when a link no longer works.
export async function GET(request: NextRequest, context: Context): Promise<Response> {
  const [action, provider] = (await context.params).nextauth;
  if (action === 'callback' && provider === 'email') {
    const token = request.nextUrl.searchParams.get('token') ?? '';
    const email = request.nextUrl.searchParams.get('email') ?? '';
    const state = await inspectSignInLink({ token, email });
    if (state !== 'valid') {
      const to = new URL('/sign-in', getEnv().APP_URL);
      to.searchParams.set('error', linkProblems[state]);
      if (email) to.searchParams.set('email', email);
      return Response.redirect(to, 303);
    }
  }
  return NextAuth(request, context, getAuthOptions());
}

export async function POST(request: NextRequest, context: Context): Promise<Response> {
  const [action, provider] = (await context.params).nextauth;
  if (action === 'signin' && provider === 'email') {
    try {
      const form = await parseBody(request.clone(), signInEmailFormSchema);
      await consumeSignInAllowance({ email: form.email, ip: clientIp(request.headers) });
    } catch (error) {
      return toErrorResponse(error);
    }
    const response = await NextAuth(request, context, getAuthOptions());
    return explainSignInResult(response);
  }
  return NextAuth(request, context, getAuthOptions());
}

/** Turns next-auth's redirect-with-error answers into the API's error shape for our own form. */
async function explainSignInResult(response: Response): Promise<Response> {
  if (!response.headers.get('content-type')?.includes('application/json')) return response;
  const { url } = (await response.clone().json()) as { url?: string };
  const target = url ? new URL(url) : null;
  if (target?.searchParams.get('csrf') === 'true') {
    return toErrorResponse(new AppError('csrf_failed', 'This page has been open too long. Reload it and try again.', 403));
  }
  if (target?.searchParams.get('error')) {
    return toErrorResponse(
      new AppError('email_unavailable', 'We could not send the sign-in e-mail just now. Please try again in a minute.', 503, undefined, 60),
    );
  }
  return response;
}
