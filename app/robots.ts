import type { MetadataRoute } from 'next';
import { getEnv } from '@/lib/env';
import { robotsFor } from '@/lib/seo/discovery';

export const dynamic = 'force-dynamic';

export default function robots(): MetadataRoute.Robots {
  return robotsFor(getEnv().APP_URL);
}
