import { z } from 'zod';
import { emailAddressSchema } from '@/lib/auth/email-address';

// Shared by the join form, the route handlers and the lib functions: one schema per input, types from z.infer.

export const waitlistSources = ['design_page', 'drop_page', 'waitlist_page', 'account', 'import'] as const;
export type WaitlistSource = (typeof waitlistSources)[number];
/** What a visitor's browser may say it came from; an import is the studio's own doing, never the public API's. */
export const publicWaitlistSources = ['design_page', 'drop_page', 'waitlist_page', 'account'] as const;

export const maxDesignsPerJoin = 10;
export const maxFinishesPerJoin = 40;

/**
 * An IANA zone name as the browser reports it (Intl.DateTimeFormat().resolvedOptions().timeZone), checked
 * with Intl itself and stored in its canonical spelling. Offsets such as "+02:00" are refused: they do not
 * follow summer time.
 */
export function canonicalTimeZone(value: string): string | null {
  if (value.length > 64 || !/^[A-Za-z][A-Za-z0-9_+\-]*(\/[A-Za-z0-9_+\-]+)*$/.test(value)) return null;
  try {
    return new Intl.DateTimeFormat('en', { timeZone: value }).resolvedOptions().timeZone;
  } catch {
    return null;
  }
}

/** Optional: an empty or missing zone is no zone; anything else must be a zone Intl knows. */
export const timeZoneSchema = z
  .string({ error: 'The time zone must be a name such as Europe/Dublin.' })
  .max(100, 'That time zone name is far too long.')
  .optional()
  .transform((value, ctx) => {
    if (value === undefined || value.trim() === '') return undefined;
    const zone = canonicalTimeZone(value.trim());
    if (zone) return zone;
    ctx.addIssue({ code: 'custom', message: 'Your browser sent a time zone we do not recognise. Leave it out and try again.' });
    return z.NEVER;
  });

const uuidList = (what: string) => z.uuid({ error: `Each ${what} must be the id of a ${what}.` });

const designIdsSchema = z
  .array(uuidList('design'), { error: 'Choose at least one design.' })
  .min(1, 'Choose at least one design.')
  .max(maxDesignsPerJoin, `Choose at most ${maxDesignsPerJoin} designs at once.`)
  .transform((ids) => [...new Set(ids)]);

const finishIdsSchema = z
  .array(uuidList('finish'), { error: 'Finishes must be a list.' })
  .max(maxFinishesPerJoin, `Choose at most ${maxFinishesPerJoin} finishes.`)
  .transform((ids) => [...new Set(ids)])
  .default([]);

/** The body of POST /api/waitlist. `email` may be left out only by a signed-in buyer, whose own address is used. */
export const joinWaitlistRequestSchema = z.object({
  email: emailAddressSchema.optional(),
  designIds: designIdsSchema,
  finishIds: finishIdsSchema,
  timeZone: timeZoneSchema,
  source: z.enum(publicWaitlistSources, { error: 'source must be one of the pages that show the waitlist form.' }).default('waitlist_page'),
});
export type JoinWaitlistRequest = z.infer<typeof joinWaitlistRequestSchema>;

/** The body of the one-click unsubscribe POST (RFC 8058 §3.1), with our own optional "leave everything". */
export const oneClickUnsubscribeSchema = z.object({
  'List-Unsubscribe': z.literal('One-Click', { error: 'Send the body List-Unsubscribe=One-Click to leave the waitlist.' }),
  scope: z.enum(['entry', 'all'], { error: 'scope must be entry or all.' }).default('entry'),
});

/** A signed link's token as it arrives in a query string or a body. */
export const linkTokenSchema = z.string({ error: 'This link is damaged.' }).min(1, 'This link is damaged.').max(1000, 'This link is damaged.');
export const tokenBodySchema = z.object({ t: linkTokenSchema });

export const leaveEntryFormSchema = z.object({ entryId: z.uuid({ error: 'That is not one of your waitlist entries.' }) });
/** "Leave all" must be asked for by name, so an empty or forged form leaves nothing. */
export const leaveAllFormSchema = z.object({ scope: z.literal('all', { error: 'Use the “Leave all” button to leave every waitlist.' }) });

export type WaitlistState = 'pending' | 'confirmed' | 'left';

/** "i•••@marrowgate.example": enough for its owner to recognise, too little for anyone else to use. */
export function maskEmail(email: string): string {
  const at = email.lastIndexOf('@');
  if (at <= 0) return '•••';
  const local = email.slice(0, at);
  const shown = local.length <= 2 ? local.slice(0, 1) : local.slice(0, 2);
  return `${shown}•••@${email.slice(at + 1)}`;
}
