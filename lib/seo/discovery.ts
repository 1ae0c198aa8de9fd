import type { MetadataRoute } from 'next';

// What search engines are told: the shop's public pages are listed; the workshop, the account, sign-in and the
// API are not for indexing. (The rules and fields follow Next.js' robots.ts and sitemap.ts conventions, which
// write RFC 9309 robots.txt and the sitemaps.org 0.9 protocol.)

/** Paths no crawler needs: private pages and the machinery behind them. */
export const disallowedPaths = ['/workshop', '/account', '/sign-in', '/api/', '/orders/', '/waitlist/confirm', '/waitlist/unsubscribe'];

export function robotsFor(appUrl: string): MetadataRoute.Robots {
  const base = new URL(appUrl);
  return {
    rules: [{ userAgent: '*', allow: '/', disallow: disallowedPaths }],
    sitemap: new URL('/sitemap.xml', base).toString(),
  };
}

export type SitemapInput = {
  designs: { slug: string }[];
  drops: { id: string; opensAt: string; closesAt: string }[];
};

/**
 * The shop's public pages: the home page, the waitlist, each published design, and each drop that has not
 * closed yet (a closed drop's page stays reachable from links, but is not worth a crawler's visit).
 */
export function sitemapFor(appUrl: string, input: SitemapInput, now: Date): MetadataRoute.Sitemap {
  const base = new URL(appUrl);
  const at = (pathname: string) => new URL(pathname, base).toString();
  const open = input.drops.filter((drop) => new Date(drop.closesAt) > now);
  return [
    { url: at('/'), changeFrequency: 'daily', priority: 1 },
    { url: at('/waitlist'), changeFrequency: 'weekly', priority: 0.5 },
    ...input.designs.map((design) => ({
      url: at(`/designs/${encodeURIComponent(design.slug)}`),
      changeFrequency: 'weekly' as const,
      priority: 0.8,
    })),
    ...open.map((drop) => ({ url: at(`/drops/${drop.id}`), changeFrequency: 'hourly' as const, priority: 0.9 })),
  ];
}
