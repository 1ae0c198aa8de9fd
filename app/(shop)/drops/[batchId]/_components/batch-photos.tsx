import Image from 'next/image';
import type { PhotoView } from '@/lib/catalogue/designs';

/** The batch's own photos, from the studio's bench: shown only when the maker has added some. */
export function BatchPhotos({ photos }: { photos: PhotoView[] }) {
  if (photos.length === 0) return null;
  return (
    <section aria-labelledby="batch-photos-title" className="mt-8">
      <h2 id="batch-photos-title" className="font-sans text-sm font-semibold uppercase tracking-wider text-ink-soft">
        From this batch
      </h2>
      <ul className="mt-3 grid grid-cols-2 gap-4 sm:grid-cols-3 lg:grid-cols-4">
        {photos.map((photo) => (
          <li key={photo.src} className="overflow-hidden rounded-sm bg-paper-deep">
            <Image
              src={photo.src}
              alt={photo.alt}
              width={photo.width}
              height={photo.height}
              sizes="(min-width: 1024px) 16rem, (min-width: 640px) 30vw, 46vw"
              className="h-auto w-full"
            />
          </li>
        ))}
      </ul>
    </section>
  );
}
