import { describe, expect, it } from 'vitest';
import { disallowedPaths, robotsFor, sitemapFor } from '@/lib/seo/discovery';

const appUrl = 'https://shop.example';

describe('robots.txt', () => {
  it('lets crawlers see the shop and keeps them out of the workshop, the account and the API', () => {
    const robots = robotsFor(appUrl);
    const rules = Array.isArray(robots.rules) ? robots.rules : [robots.rules];
    expect(rules).toHaveLength(1);
    const [rule] = rules;
    expect(rule?.userAgent).toBe('*');
    expect(rule?.allow).toBe('/');
    for (const path of ['/workshop', '/account', '/api/']) expect(rule?.disallow).toContain(path);
    expect(robots.sitemap).toBe('https://shop.example/sitemap.xml');
  });

  it('disallows only private paths, never a design or drop page', () => {
    for (const path of disallowedPaths) {
      expect(path.startsWith('/designs') || path.startsWith('/drops')).toBe(false);
    }
  });
});

describe('sitemap.xml', () => {
  const now = new Date('2026-12-01T12:00:00Z');
  const input = {
    designs: [{ slug: 'hare-of-the-fen' }, { slug: 'owl moth' }],
    drops: [
      { id: '11111111-1111-4111-8111-111111111111', opensAt: '2026-12-05T17:00:00Z', closesAt: '2026-12-06T17:00:00Z' },
      { id: '22222222-2222-4222-8222-222222222222', opensAt: '2026-10-01T17:00:00Z', closesAt: '2026-10-02T17:00:00Z' },
    ],
  };

  it('lists the home page, the waitlist, every published design and each drop that has not closed', () => {
    const urls = sitemapFor(appUrl, input, now).map((entry) => entry.url);
    expect(urls).toEqual([
      'https://shop.example/',
      'https://shop.example/waitlist',
      'https://shop.example/designs/hare-of-the-fen',
      'https://shop.example/designs/owl%20moth',
      'https://shop.example/drops/11111111-1111-4111-8111-111111111111',
    ]);
  });

  it('gives absolute URLs on the configured host only (the sitemaps.org protocol asks for full URLs of one host)', () => {
    for (const entry of sitemapFor(appUrl, input, now)) {
      const url = new URL(entry.url);
      expect(url.origin).toBe('https://shop.example');
      expect(entry.priority).toBeGreaterThanOrEqual(0);
      expect(entry.priority).toBeLessThanOrEqual(1);
    }
  });
});
