import type { NextRequest } from 'next/server';
import { createRouteHandler } from 'uploadthing/next';
import { AppError } from '@/lib/api/errors';
import { apiHandler } from '@/lib/api/handler';
import { getCurrentUser } from '@/lib/auth/session';
import { assertUploadsConfigured } from '@/lib/photos/config';
import { photoFileRouter } from './core';

// uploadthing's own handler, configured by environment only: UPLOADTHING_TOKEN, and for a local fake
// UPLOADTHING_INGEST_URL, UPLOADTHING_API_URL, UPLOADTHING_CALLBACK_URL and UPLOADTHING_IS_DEV (read by
// uploadthing itself). GET is the route's configuration for the browser; POST is both the browser's
// "may I upload" (?actionType=upload) and the upload service's signed callbacks (uploadthing-hook).
const uploadthing = createRouteHandler({ router: photoFileRouter });

// Both methods read the environment and the session on every request: never prerendered.
export const dynamic = 'force-dynamic';

export const GET = apiHandler(async (request: Request) => {
  assertUploadsConfigured();
  return uploadthing.GET(request as NextRequest);
});

export const POST = apiHandler(async (request: Request) => {
  assertUploadsConfigured();
  const isUploadRequest = new URL(request.url).searchParams.get('actionType') === 'upload' && !request.headers.has('uploadthing-hook');
  // Who is asking is answered here (401); what they may do, in the route's middleware (403).
  if (isUploadRequest && !(await getCurrentUser())) {
    throw new AppError('unauthenticated', 'Sign in as the studio’s maker to add photos.', 401);
  }
  return uploadthing.POST(request as NextRequest);
});
