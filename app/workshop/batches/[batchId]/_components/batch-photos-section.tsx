import Image from 'next/image';
import type { BatchPhoto } from '@/lib/photos/batch-photos';
import { BatchPhotoUploader } from './batch-photo-uploader';

type Props = { batch: { id: string; designId: string; name: string }; photos: BatchPhoto[]; owner: boolean };

/**
 * The batch's own photos: what this pull looks like, shown on its drop page before the design's photos.
 * The maker adds them here; staff see them.
 */
export function BatchPhotosSection({ batch, photos, owner }: Props) {
  return (
    <section aria-labelledby="batch-photos-title" className="mt-10 grid max-w-3xl gap-4">
      <h2 id="batch-photos-title" className="text-2xl font-medium">
        Photos of this batch <span className="font-sans text-base font-normal text-ink-soft">· {photos.length === 1 ? '1 photo' : `${photos.length} photos`}</span>
      </h2>
      <p className="text-sm text-ink-soft">
        They show on the drop page; the first one is the drop’s cover. The design’s own photos stay as they are.
      </p>
      {owner ? <BatchPhotoUploader designId={batch.designId} batchId={batch.id} /> : null}
      {photos.length === 0 ? (
        <p className="rounded-sm border border-paper-edge bg-paper px-4 py-3 text-sm text-ink-soft">No photos of {batch.name} yet.</p>
      ) : (
        <ol className="grid gap-3">
          {photos.map((photo, index) => (
            <li key={photo.id} className="grid grid-cols-[6rem_1fr] gap-3 rounded-sm border border-paper-edge bg-paper p-3">
              <div className="relative aspect-[4/5] w-24 overflow-hidden rounded-sm bg-paper-deep">
                {/* Its description is written out beside it, so it is not read twice. */}
                <Image src={photo.src} alt="" fill sizes="6rem" className="object-cover" />
              </div>
              <div className="text-sm">
                <p className="font-semibold">
                  Photo {index + 1} of {photos.length}
                </p>
                <p className="text-ink-soft">{photo.alt}</p>
              </div>
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}
