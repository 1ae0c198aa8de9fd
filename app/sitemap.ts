import type { MetadataRoute } from 'next';
import { listDesignsForHomeCached } from '@/lib/catalogue/cached';
import { listDrops } from '@/lib/drops/catalogue';
import { getEnv } from '@/lib/env';
import { sitemapFor } from '@/lib/seo/discovery';

export const dynamic = 'force-dynamic';

export default async function sitemap(): Promise<MetadataRoute.Sitemap> {
  const [{ designs }, drops] = await Promise.all([listDesignsForHomeCached(), listDrops()]);
  return sitemapFor(getEnv().APP_URL, { designs, drops }, new Date());
}
