'use client';

import dynamic from 'next/dynamic';
import { useRouter } from 'next/navigation';

// The uploader brings the upload service's client with it: loaded in the browser, only where it is shown.
const PhotoUploader = dynamic(() => import('@/components/workshop/photo-uploader').then((module) => module.PhotoUploader), {
  ssr: false,
  loading: () => <p className="text-sm text-ink-soft">Loading the uploader…</p>,
});

/** Adds photos of one batch; the list beside it is drawn again once a photo is in. */
export function BatchPhotoUploader({ designId, batchId }: { designId: string; batchId: string }) {
  const router = useRouter();
  return <PhotoUploader designId={designId} batchId={batchId} onUploaded={() => router.refresh()} />;
}
