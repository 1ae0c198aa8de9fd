import Image from 'next/image';
import Link from 'next/link';
import { Price } from '@/components/ui/price';
import type { DesignCard as DesignCardData } from '@/lib/catalogue/designs';

export function DesignCard({ design, priority = false }: { design: DesignCardData; priority?: boolean }) {
  return (
    <li>
      <Link href={`/designs/${design.slug}`} className="group block" aria-label={`${design.name}: see the design`}>
        <div className="relative aspect-[4/5] overflow-hidden rounded-sm bg-paper-deep">
          {design.cover ? (
            <Image
              src={design.cover.src}
              alt={design.cover.alt}
              fill
              priority={priority}
              sizes="(min-width: 1024px) 24rem, (min-width: 640px) 45vw, 92vw"
              className="object-cover transition duration-500 group-hover:scale-[1.02]"
            />
          ) : (
            <div className="flex h-full items-center justify-center text-sm text-ink-faint">Photo to come</div>
          )}
        </div>
        <div className="mt-4 flex items-baseline justify-between gap-3">
          <h3 className="text-2xl font-medium group-hover:underline group-hover:underline-offset-4">{design.name}</h3>
          <p className="text-ink-soft">
            from <Price value={design.fromPrice} className="text-ink" />
          </p>
        </div>
        <p className="mt-1 text-ink-soft">{design.summary}</p>
        <p className="mt-2 text-sm text-ink-faint">
          {design.finishNames.length} {design.finishNames.length === 1 ? 'finish' : 'finishes'}:{' '}
          {design.finishNames.join(', ')}
        </p>
      </Link>
    </li>
  );
}

/** The card's shape without its content, for the loading state. */
export function DesignCardSkeleton() {
  return (
    <li aria-hidden="true" className="animate-pulse">
      <div className="aspect-[4/5] rounded-sm bg-paper-deep" />
      <div className="mt-4 h-7 w-2/5 rounded bg-paper-deep" />
      <div className="mt-2 h-4 w-4/5 rounded bg-paper-deep" />
      <div className="mt-2 h-4 w-3/5 rounded bg-paper-deep" />
    </li>
  );
}
