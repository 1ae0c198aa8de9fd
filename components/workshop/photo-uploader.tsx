'use client';

import { generateReactHelpers } from '@uploadthing/react';
import { useId, useRef, useState, type DragEvent } from 'react';
import type { PhotoFileRouter, PhotoUploadResult } from '@/app/api/uploadthing/core';
import {
  DEFAULT_PHOTO_MAX_BYTES,
  formatMegabytes,
  PHOTO_ACCEPT,
  PHOTO_MAX_FILES,
  PHOTO_MIME_TYPES,
} from '@/lib/photos/renditions';

const { useUploadThing } = generateReactHelpers<PhotoFileRouter>({ url: '/api/uploadthing' });

type Props = { designId: string; finishId?: string | null; batchId?: string | null; onUploaded?: () => void };
type Outcome = { name: string; ok: boolean; text: string };

const ACCEPT_ATTRIBUTE = Object.entries(PHOTO_ACCEPT)
  .flatMap(([mime, endings]) => [mime, ...endings])
  .join(',');
const TYPES_IN_WORDS = 'JPEG, PNG, WebP or AVIF';

const looksLikePhoto = (file: File) =>
  PHOTO_MIME_TYPES.some((mime) => mime === file.type) ||
  (file.type === '' && Object.values(PHOTO_ACCEPT).some((endings) => endings.some((ending) => file.name.toLowerCase().endsWith(ending))));

/** The route's own limit, as its configuration says ("20971520B"), so the words match the server. */
function routeMaxBytes(maxFileSize: string | undefined): number {
  const match = /^(\d+(?:\.\d+)?)\s*(B|KB|MB|GB)$/i.exec(maxFileSize ?? '');
  if (!match) return DEFAULT_PHOTO_MAX_BYTES;
  const power = ['B', 'KB', 'MB', 'GB'].indexOf(match[2]!.toUpperCase());
  return Math.floor(Number(match[1]) * 1024 ** power);
}

/** The words to show for a refused upload: the app's message when the server sent one. */
function refusalMessage(error: { message: string; cause?: unknown }): string {
  const body = error.cause as { error?: { message?: unknown }; message?: unknown } | undefined;
  if (typeof body?.error?.message === 'string') return body.error.message;
  if (/^(Request to |XHR failed|Failed to report event)/.test(error.message)) {
    return 'The upload did not go through. Check the connection and try again.';
  }
  return error.message;
}

/**
 * Adds photos to a design (or one of its finishes, or one of its batches) in the workshop: pick with the button or drop files
 * on the area. The files go straight to the upload service; the studio's server then checks each one,
 * removes its location and camera details and makes the sizes the shop shows. Its answer, a refusal
 * included, is shown here file by file.
 */
export function PhotoUploader({ designId, finishId = null, batchId = null, onUploaded }: Props) {
  const inputRef = useRef<HTMLInputElement>(null);
  const headingId = useId();
  const limitsId = useId();
  const [dragging, setDragging] = useState(false);
  const [progress, setProgress] = useState(0);
  const [phase, setPhase] = useState<'idle' | 'uploading' | 'processing'>('idle');
  const [problem, setProblem] = useState<string | null>(null);
  const [outcomes, setOutcomes] = useState<Outcome[]>([]);

  const { startUpload, routeConfig } = useUploadThing('designPhoto', {
    uploadProgressGranularity: 'fine',
    onUploadBegin: () => setPhase('uploading'),
    onUploadProgress: (percent) => {
      setProgress(percent);
      if (percent >= 100) setPhase('processing');
    },
    onUploadError: (error) => setProblem(refusalMessage(error)),
  });
  const maxBytes = routeMaxBytes(routeConfig?.image?.maxFileSize);
  const busy = phase !== 'idle';

  async function upload(chosen: File[]) {
    if (busy || chosen.length === 0) return;
    setProblem(null);
    setProgress(0);
    if (chosen.length > PHOTO_MAX_FILES) {
      setOutcomes([]);
      setProblem(`Choose at most ${PHOTO_MAX_FILES} photos at a time: you chose ${chosen.length}.`);
      return;
    }
    const refused: Outcome[] = [];
    const files = chosen.filter((file) => {
      if (!looksLikePhoto(file)) {
        refused.push({ name: file.name, ok: false, text: `Not a ${TYPES_IN_WORDS} photo, so it was not sent.` });
        return false;
      }
      if (file.size > maxBytes) {
        refused.push({ name: file.name, ok: false, text: `${formatMegabytes(file.size)}, over the ${formatMegabytes(maxBytes)} limit: export it smaller and try again.` });
        return false;
      }
      return true;
    });
    setOutcomes(refused);
    if (files.length === 0) return;

    setPhase('uploading');
    try {
      const results = await startUpload(files, { designId, finishId, batchId });
      if (!results) return; // refused as a whole: onUploadError has said why
      const done = results.map((result): Outcome => {
        const data = result.serverData as PhotoUploadResult | null | undefined;
        if (!data) return { name: result.name, ok: false, text: 'Arrived, but the studio did not confirm it. Reload the page to see whether it is there.' };
        return data.ok ? { name: result.name, ok: true, text: 'Added.' } : { name: result.name, ok: false, text: data.message };
      });
      setOutcomes([...refused, ...done]);
      if (done.some((outcome) => outcome.ok)) onUploaded?.();
    } finally {
      setPhase('idle');
      setProgress(0);
      if (inputRef.current) inputRef.current.value = '';
    }
  }

  function onDrop(event: DragEvent<HTMLDivElement>) {
    event.preventDefault();
    setDragging(false);
    void upload(Array.from(event.dataTransfer.files));
  }

  const statusText =
    phase === 'uploading' ? `Uploading… ${Math.round(progress)}%` : phase === 'processing' ? 'Uploaded. Checking the photos and making their sizes…' : '';

  return (
    <section aria-labelledby={headingId} className="grid gap-3">
      <h3 id={headingId} className="font-sans text-sm font-semibold uppercase tracking-wider text-ink-soft">
        Add photos
      </h3>
      <div
        role="group"
        aria-labelledby={headingId}
        aria-describedby={limitsId}
        aria-busy={busy}
        onDragOver={(event) => {
          event.preventDefault();
          if (!busy) setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={onDrop}
        className={`grid justify-items-center gap-3 rounded-sm border-2 border-dashed px-6 py-8 text-center transition-colors ${
          dragging ? 'border-ink bg-paper-deep' : 'border-paper-edge bg-paper'
        }`}
      >
        <p className="text-ink-soft">{dragging ? 'Drop the photos to add them.' : 'Drag photos here, or'}</p>
        <button
          type="button"
          disabled={busy}
          onClick={() => inputRef.current?.click()}
          className="rounded-full bg-ink px-5 py-2 font-semibold text-paper focus-visible:outline focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-ember disabled:opacity-60"
        >
          {busy ? 'Uploading…' : 'Choose photos'}
        </button>
        <input
          ref={inputRef}
          type="file"
          multiple
          accept={ACCEPT_ATTRIBUTE}
          tabIndex={-1}
          aria-hidden="true"
          className="sr-only"
          onChange={(event) => void upload(Array.from(event.target.files ?? []))}
        />
        <p id={limitsId} className="text-sm text-ink-faint">
          {TYPES_IN_WORDS} · up to {formatMegabytes(maxBytes)} each · up to {PHOTO_MAX_FILES} at a time. Location and camera
          details are removed from every photo.
        </p>
      </div>

      <div aria-live="polite" className="grid gap-2">
        {busy ? (
          <>
            <progress
              max={100}
              value={phase === 'processing' ? undefined : progress}
              aria-label="Upload progress"
              className="h-2 w-full overflow-hidden rounded-full accent-moss"
            />
            <p className="text-sm text-ink-soft">{statusText}</p>
          </>
        ) : null}
        {problem ? (
          <p role="alert" className="text-sm font-semibold text-ember-deep">
            {problem}
          </p>
        ) : null}
        {outcomes.length > 0 ? (
          <ul className="grid gap-1 text-sm">
            {outcomes.map((outcome, index) => (
              <li key={`${outcome.name}-${index}`} className={outcome.ok ? 'text-moss' : 'font-semibold text-ember-deep'}>
                <span className="font-semibold">{outcome.name}</span>{outcome.ok ? '' : ' (not added)'}: {outcome.text}
              </li>
            ))}
          </ul>
        ) : null}
      </div>
    </section>
  );
}
