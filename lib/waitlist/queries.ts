import 'server-only';
import type { CurrentUser } from '@/lib/auth/session';
import { sql } from '@/lib/db/sql';
import { readUnsubscribeToken } from './leave';
import { maskEmail, type WaitlistState } from './schemas';

export type WaitlistDesign = { id: string; slug: string; name: string; finishes: { id: string; name: string }[] };

/** The designs one may wait for (published, with their published finishes), in the shop's order. */
export async function listWaitlistDesigns({ slug }: { slug?: string } = {}): Promise<WaitlistDesign[]> {
  return sql<WaitlistDesign>(
    `SELECT d.id, d.slug, d.name,
            coalesce((SELECT json_agg(json_build_object('id', f.id, 'name', f.name) ORDER BY f.position, f.name)
                        FROM finishes f WHERE f.design_id = d.id AND f.status = 'published'), '[]') AS finishes
       FROM designs d
      WHERE d.status = 'published' AND ($1::text IS NULL OR d.slug = $1)
      ORDER BY d.position, d.name`,
    [slug ?? null],
  );
}

export type MyWaitlistEntry = {
  id: string; designName: string; designSlug: string; finishNames: string[]; state: WaitlistState;
  confirmedAt: string | null; leftAt: string | null; createdAt: string;
};

/** The signed-in buyer's entries: linked to their account, or made with their address before it was. */
export async function listMyWaitlistEntries({ user }: { user: Pick<CurrentUser, 'id' | 'email'> }): Promise<MyWaitlistEntry[]> {
  const rows = await sql<{
    id: string; design_name: string; design_slug: string; finish_names: string[]; state: WaitlistState;
    confirmed_at: Date | null; left_at: Date | null; created_at: Date;
  }>(
    `SELECT e.id, d.name AS design_name, d.slug AS design_slug, e.state, e.confirmed_at, e.left_at, e.created_at,
            ARRAY(SELECT f.name FROM finishes f WHERE f.id = ANY(e.finish_ids) ORDER BY f.position) AS finish_names
       FROM waitlist_entries e JOIN designs d ON d.id = e.design_id
      WHERE e.user_id = $1 OR e.email = $2
      ORDER BY e.state = 'left', d.position, d.name`,
    [user.id, user.email],
  );
  return rows.map((r) => ({
    id: r.id,
    designName: r.design_name,
    designSlug: r.design_slug,
    finishNames: r.finish_names,
    state: r.state,
    confirmedAt: r.confirmed_at?.toISOString() ?? null,
    leftAt: r.left_at?.toISOString() ?? null,
    createdAt: r.created_at.toISOString(),
  }));
}

/**
 * What the unsubscribe page shows for a link: null when the link is damaged. An entry that no longer exists
 * shows as a plain "this waitlist", and its button answers exactly as a real one would.
 */
export async function getUnsubscribeView({ token }: { token: string | null | undefined }): Promise<
  { designName: string | null; maskedEmail: string | null; alreadyLeft: boolean; otherEntries: number } | null
> {
  const entryId = readUnsubscribeToken(token);
  if (!entryId) return null;
  const [row] = await sql<{ design_name: string; email: string; state: WaitlistState; others: number }>(
    `SELECT d.name AS design_name, e.email, e.state,
            (SELECT count(*)::int FROM waitlist_entries o WHERE o.email = e.email AND o.id <> e.id AND o.state <> 'left') AS others
       FROM waitlist_entries e JOIN designs d ON d.id = e.design_id WHERE e.id = $1`,
    [entryId],
  );
  if (!row) return { designName: null, maskedEmail: null, alreadyLeft: false, otherEntries: 0 };
  return { designName: row.design_name, maskedEmail: maskEmail(row.email), alreadyLeft: row.state === 'left', otherEntries: row.others };
}
