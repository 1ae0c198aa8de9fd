import 'server-only';
import { unstable_cache } from 'next/cache';
import { getPublishedDesignBySlug, listDesignsForHome } from './designs';

// The shop's catalogue changes only when the studio edits it: pages read it from Next's data cache,
// and the workshop drops the `catalogue` tag when a design, finish or photo changes.
export const catalogueTag = 'catalogue';

export const listDesignsForHomeCached = unstable_cache(listDesignsForHome, ['home-designs'], { tags: [catalogueTag], revalidate: 300 });

export const getPublishedDesignBySlugCached = (slug: string) =>
  unstable_cache(() => getPublishedDesignBySlug(slug), ['design', slug], { tags: [catalogueTag, `design:${slug}`], revalidate: 300 })();
