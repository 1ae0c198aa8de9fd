'use client';

import dynamic from 'next/dynamic';
import { useRouter } from 'next/navigation';
import { useId, useState } from 'react';
import { inputStyle } from './fields';

// The uploader (another engineer's client component) brings the upload service's client with it: loaded
// only on this page, when it is shown.
const PhotoUploader = dynamic(() => import('@/components/workshop/photo-uploader').then((module) => module.PhotoUploader), {
  ssr: false,
  loading: () => <p className="text-sm text-ink-soft">Loading the uploader…</p>,
});

/** Upload photos of the design as a whole or of one of its finishes; the lists below refresh after. */
export function UploadPhotos({ designId, finishes }: { designId: string; finishes: { id: string; name: string }[] }) {
  const router = useRouter();
  const [target, setTarget] = useState('');
  const selectId = useId();
  return (
    <section aria-labelledby={`${selectId}-title`} className="grid gap-3 rounded-sm border border-paper-edge bg-paper p-4 sm:p-5">
      <h3 id={`${selectId}-title`} className="font-sans text-base font-semibold">
        Upload photos
      </h3>
      <div className="grid max-w-sm gap-1">
        <label htmlFor={selectId} className="text-sm font-semibold">
          Photos of
        </label>
        <select id={selectId} value={target} onChange={(event) => setTarget(event.target.value)} className={inputStyle}>
          <option value="">The design as a whole</option>
          {finishes.map((finish) => (
            <option key={finish.id} value={finish.id}>
              {finish.name}
            </option>
          ))}
        </select>
      </div>
      {/* Keyed by its target, so a change of target starts a fresh uploader. */}
      <PhotoUploader key={target || 'design'} designId={designId} finishId={target || null} onUploaded={() => router.refresh()} />
    </section>
  );
}
