import { z } from 'zod';

/** A design's or finish's URL name: lower-case words joined by hyphens, as the database's CHECK allows. */
export const slugSchema = z
  .string()
  .max(80)
  .regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'Use lower-case letters, digits and single hyphens');

export const designPageParamsSchema = z.object({ slug: slugSchema });
export const designPageSearchSchema = z.object({ finish: slugSchema.optional().catch(undefined) });
