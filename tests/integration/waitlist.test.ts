import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import type { CurrentUser } from '@/lib/auth/session';
import { query } from './support/database';
import { withAppDatabase } from './support/app-database';

// The buyer's side of the waitlist, called as the app calls it: lib functions directly, route handlers with
// a plain Request (no cookie), the session resolved to whoever the test says.
let currentUser: CurrentUser | null = null;
vi.mock('@/lib/auth/session', () => ({ getCurrentUser: async () => currentUser }));

const db = withAppDatabase('waitlist', { seed: true });

type Design = { id: string; name: string; slug: string };
type Finish = { id: string; name: string; design_id: string };
let hare: Design;
let ibex: Design;
let otherDesignNames: string[];
let hareFinishes: Finish[];
let ibexFinish: Finish;
let ipCounter = 0;
/** Each join gets its own network, so the per-IP limit is only met where a test means to meet it. */
const freshIp = () => `192.0.2.${(ipCounter += 1)}`;

const run = <T extends object>(text: string, bind: unknown[] = []) => query<T>(db.current().url, text, bind);

beforeAll(async () => {
  const designs = await run<Design>(`SELECT id, name, slug FROM designs WHERE status = 'published' ORDER BY position`);
  hare = designs.find((d) => d.slug === 'hare')!;
  ibex = designs.find((d) => d.slug === 'ibex')!;
  otherDesignNames = designs.filter((d) => d.id !== hare.id).map((d) => d.name);
  hareFinishes = await run<Finish>(`SELECT id, name, design_id FROM finishes WHERE design_id = $1 AND status = 'published' ORDER BY position`, [hare.id]);
  ibexFinish = (await run<Finish>(`SELECT id, name, design_id FROM finishes WHERE design_id = $1 AND status = 'published' LIMIT 1`, [ibex.id]))[0]!;
  expect(hare && ibex && hareFinishes.length >= 2 && ibexFinish).toBeTruthy();
});

async function join(email: string, extra: Partial<{ designIds: string[]; finishIds: string[]; source: 'import' | 'design_page'; user: CurrentUser | null; ip: string }> = {}) {
  const { joinWaitlist } = await import('@/lib/waitlist/join');
  return joinWaitlist({ email, designIds: [hare.id], source: 'design_page', ip: freshIp(), ...extra });
}

type Mail = { id: string; subject: string; text: string; html: string; headers: Record<string, string>; dedupe_key: string; waitlist_entry_id: string | null };
const mailTo = (email: string) => run<Mail>(`SELECT id, subject, text, html, headers, dedupe_key, waitlist_entry_id FROM mail_outbox WHERE to_address = $1 ORDER BY created_at`, [email]);
type Entry = { id: string; state: string; confirmed_at: Date | null; left_at: Date | null; confirm_token_hash: string | null; user_id: string | null; finish_ids: string[] };
const entryOf = async (email: string, designId = hare.id) =>
  (await run<Entry>(`SELECT id, state, confirmed_at, left_at, confirm_token_hash, user_id, finish_ids FROM waitlist_entries WHERE email = $1 AND design_id = $2`, [email, designId]))[0];

/** The token of the newest confirmation link sent to `email`, as the buyer would click it. */
async function confirmTokenFor(email: string): Promise<string> {
  const mails = await mailTo(email);
  const match = /\/waitlist\/confirm\?t=([A-Za-z0-9_\-.]+)/.exec(mails.at(-1)!.text);
  return match![1]!;
}

async function buyer(email: string): Promise<CurrentUser> {
  const { getDb } = await import('@/lib/db/connection');
  const user = await getDb().models.User.create({ email, name: null, emailVerified: null, role: 'customer' });
  return { id: user.id, email, name: null, role: 'customer' };
}

describe('confirmed opt-in', () => {
  it('sends only the confirmation until its link is used, and the confirmation is plain', async () => {
    const email = 'wren.visitor@example.com';
    const result = await join(email, { finishIds: [hareFinishes[1]!.id] });
    expect(result.results).toEqual([expect.objectContaining({ designId: hare.id, outcome: 'confirmation_sent' })]);
    expect(result.results[0]!.message).toMatch(/Check your inbox to confirm/);

    const entry = await entryOf(email);
    expect(entry).toMatchObject({ state: 'pending', confirmed_at: null, finish_ids: [hareFinishes[1]!.id] });
    const mails = await mailTo(email);
    expect(mails).toHaveLength(1);
    const [mail] = mails;
    expect(mail!.waitlist_entry_id).toBe(entry!.id);
    // Only the hash of the one-time secret is stored: the secret in the link is not in the entry.
    const nonce = mail!.dedupe_key.split(':')[2]!;
    expect(mail!.dedupe_key).toBe(`waitlist-confirm:${entry!.id}:${nonce}`);
    expect(entry!.confirm_token_hash).not.toContain(nonce);
    expect(entry!.confirm_token_hash).toMatch(/^[0-9a-f]{64}$/);

    // It says what was asked for, and that nothing else comes until confirmed.
    expect(mail!.text).toContain(hare.name);
    expect(mail!.text).toContain(hareFinishes[1]!.name);
    expect(mail!.text).toMatch(/Until you do, we send nothing else/);
    // No advertising: no other design, no price, no link into the shop's catalogue or drops.
    for (const other of otherDesignNames) expect(mail!.text).not.toContain(other);
    expect(mail!.text).not.toMatch(/€|EUR|\/designs\/|\/drops\//);
    // The studio's name and postal address are at the foot.
    const { loadStudioSettings } = await import('@/lib/settings/studio');
    const studio = (await loadStudioSettings())!;
    expect(studio.postalAddress.trim().length).toBeGreaterThan(0);
    expect(mail!.text).toContain(studio.name);
    for (const line of studio.postalAddress.split('\n').map((l) => l.trim()).filter(Boolean)) expect(mail!.text).toContain(line);
    // RFC 8058 §3.1: a one-click message carries List-Unsubscribe with an HTTPS (here the app's) URI and
    // List-Unsubscribe-Post with exactly "List-Unsubscribe=One-Click".
    expect(mail!.headers['List-Unsubscribe']).toMatch(/^<https?:\/\/[^>]+\/api\/waitlist\/unsubscribe\?t=[^>]+>$/);
    expect(mail!.headers['List-Unsubscribe-Post']).toBe('List-Unsubscribe=One-Click');

    const { checkConfirmLink, confirmWaitlist } = await import('@/lib/waitlist/confirm');
    const token = await confirmTokenFor(email);
    // Opening the page reads the link without using it.
    expect((await checkConfirmLink(token)).outcome).toBe('ready');
    expect((await entryOf(email))!.state).toBe('pending');
    expect(await confirmWaitlist(token)).toMatchObject({ outcome: 'confirmed', designName: hare.name });
    const confirmed = await entryOf(email);
    expect(confirmed).toMatchObject({ state: 'confirmed', confirm_token_hash: null });
    expect(confirmed!.confirmed_at).toBeInstanceOf(Date);
    // Confirming sends nothing either.
    expect(await mailTo(email)).toHaveLength(1);
  });

  it('joining twice sends nothing new, and a stranger cannot tell a confirmed address from a new one', async () => {
    const email = 'fennel.visitor@example.com';
    await join(email);
    const again = await join(email);
    expect(again.results[0]).toMatchObject({ outcome: 'confirmation_already_sent' });
    expect(again.results[0]!.message).toMatch(/sent you a confirmation .*already/);
    expect(await mailTo(email)).toHaveLength(1);

    const { confirmWaitlist } = await import('@/lib/waitlist/confirm');
    await confirmWaitlist(await confirmTokenFor(email));
    const anonymous = await join(email);
    const fresh = await join('never.joined@example.com');
    expect(anonymous.results[0]!.outcome).toBe(fresh.results[0]!.outcome);
    expect(anonymous.results[0]!.message.replace(email, 'X')).toBe(fresh.results[0]!.message.replace('never.joined@example.com', 'X'));
    expect(await mailTo(email)).toHaveLength(1);
    expect((await entryOf(email))!.state).toBe('confirmed');
  });

  it('tells a signed-in owner their real state, and links the account when the address is confirmed', async () => {
    const email = 'moss.owner@example.com';
    const owner = await buyer(email);
    // Joined anonymously: the account is linked only when the link is used.
    await join(email);
    expect((await entryOf(email))!.user_id).toBeNull();
    const { confirmWaitlist } = await import('@/lib/waitlist/confirm');
    await confirmWaitlist(await confirmTokenFor(email));
    expect((await entryOf(email))!.user_id).toBe(owner.id);

    const signedIn = await join('ignored@example.com', { user: owner });
    expect(signedIn.email).toBe(email);
    expect(signedIn.results[0]).toMatchObject({ outcome: 'already_confirmed' });
    expect(signedIn.results[0]!.message).toMatch(/already on the waitlist/);
    expect(await mailTo('ignored@example.com')).toHaveLength(0);
  });

  it('refuses finishes of designs that were not chosen, and writes nothing', async () => {
    const email = 'sorrel.visitor@example.com';
    await expect(join(email, { finishIds: [ibexFinish.id] })).rejects.toMatchObject({ status: 422, code: 'finish_not_offered' });
    expect(await entryOf(email)).toBeUndefined();
    expect(await mailTo(email)).toHaveLength(0);
  });
});

describe('confirmation links', () => {
  it('a tampered or misused link is damaged and confirms nothing', async () => {
    const email = 'tansy.visitor@example.com';
    await join(email);
    const token = await confirmTokenFor(email);
    const [body, mac] = token.split('.') as [string, string];
    const flipped = `${body}.${mac.slice(0, -2)}${mac.endsWith('AA') ? 'BB' : 'AA'}`;
    const { confirmWaitlist, checkConfirmLink } = await import('@/lib/waitlist/confirm');
    const { signToken } = await import('@/lib/waitlist/tokens');
    const entry = await entryOf(email);
    for (const bad of [flipped, token.slice(0, 20), '', 'not.a.token', signToken('waitlist-unsubscribe', { e: entry!.id, n: 'x' })]) {
      expect((await confirmWaitlist(bad)).outcome).toBe('damaged');
      expect((await checkConfirmLink(bad)).outcome).toBe('damaged');
    }
    // Signed by us but not the entry's current secret: not confirmed either.
    expect((await confirmWaitlist(signToken('waitlist-confirm', { e: entry!.id, n: 'guessed' }))).outcome).toBe('superseded');
    expect((await entryOf(email))!.state).toBe('pending');
  });

  it('an expired link offers a fresh one, at most one every ten minutes', async () => {
    const email = 'yarrow.visitor@example.com';
    await join(email);
    const token = await confirmTokenFor(email);
    const entry = await entryOf(email);
    await run(`UPDATE waitlist_entries SET confirm_expires_at = now() - interval '1 minute' WHERE id = $1`, [entry!.id]);
    const { confirmWaitlist, resendConfirmation } = await import('@/lib/waitlist/confirm');
    expect((await confirmWaitlist(token)).outcome).toBe('expired');
    expect((await entryOf(email))!.state).toBe('pending');

    // Sent a moment ago: joining again or asking for a fresh link sends nothing yet.
    expect((await join(email)).results[0]!.outcome).toBe('confirmation_already_sent');
    expect((await resendConfirmation(token, freshIp())).outcome).toBe('sent_recently');
    expect(await mailTo(email)).toHaveLength(1);

    await run(`UPDATE waitlist_entries SET confirm_sent_at = now() - interval '73 hours' WHERE id = $1`, [entry!.id]);
    expect(await resendConfirmation(token, freshIp())).toMatchObject({ outcome: 'sent' });
    expect(await mailTo(email)).toHaveLength(2);
    // Only the newest link works.
    expect((await confirmWaitlist(token)).outcome).toBe('superseded');
    expect((await confirmWaitlist(await confirmTokenFor(email))).outcome).toBe('confirmed');
  });

  it('a used link says you are already on the list and changes nothing', async () => {
    const email = 'rue.visitor@example.com';
    await join(email);
    const token = await confirmTokenFor(email);
    const { confirmWaitlist } = await import('@/lib/waitlist/confirm');
    expect((await confirmWaitlist(token)).outcome).toBe('confirmed');
    const first = (await entryOf(email))!.confirmed_at;
    expect((await confirmWaitlist(token)).outcome).toBe('already_confirmed');
    expect((await entryOf(email))!.confirmed_at).toEqual(first);
  });
});

describe('leaving', () => {
  it('is immediate; an old link does not re-confirm; a later join, even an import, needs a new confirmation', async () => {
    const email = 'burdock.visitor@example.com';
    await join(email);
    const firstLink = await confirmTokenFor(email);
    const { confirmWaitlist } = await import('@/lib/waitlist/confirm');
    await confirmWaitlist(firstLink);
    const { leaveByToken } = await import('@/lib/waitlist/leave');
    const unsubscribe = /t=([^>]+)>/.exec((await mailTo(email))[0]!.headers['List-Unsubscribe']!)![1]!;
    await leaveByToken(unsubscribe);
    const left = await entryOf(email);
    expect(left).toMatchObject({ state: 'left' });
    expect(left!.left_at).toBeInstanceOf(Date);

    expect((await confirmWaitlist(firstLink)).outcome).toBe('left');
    expect((await entryOf(email))!.state).toBe('left');

    const rejoined = await join(email, { source: 'import' });
    expect(rejoined.results[0]!.outcome).toBe('confirmation_sent');
    expect(await entryOf(email)).toMatchObject({ state: 'pending', confirmed_at: null, left_at: null });
    expect(await mailTo(email)).toHaveLength(2);
    // The link from before leaving is dead for good.
    expect((await confirmWaitlist(firstLink)).outcome).toBe('superseded');
    expect((await entryOf(email))!.state).toBe('pending');
  });

  it('answers the same for an entry that is not on the list', async () => {
    const email = 'nettle.visitor@example.com';
    await join(email);
    const { leaveByToken } = await import('@/lib/waitlist/leave');
    const { signToken } = await import('@/lib/waitlist/tokens');
    const real = await leaveByToken(signToken('waitlist-unsubscribe', { e: (await entryOf(email))!.id }));
    const unknown = await leaveByToken(signToken('waitlist-unsubscribe', { e: randomUUID() }));
    expect(unknown).toEqual(real);
    const allReal = await leaveByToken(signToken('waitlist-unsubscribe', { e: (await entryOf(email))!.id }), 'all');
    const allUnknown = await leaveByToken(signToken('waitlist-unsubscribe', { e: randomUUID() }), 'all');
    expect(allUnknown).toEqual(allReal);
    await expect(leaveByToken('forged.token')).rejects.toMatchObject({ status: 400, code: 'damaged_link' });
  });

  it('the one-click POST leaves without a cookie (RFC 8058), and a bad token is a 400 in the error shape', async () => {
    const email = 'sage.visitor@example.com';
    await join(email, { designIds: [hare.id, ibex.id] });
    const { POST } = await import('@/app/api/waitlist/unsubscribe/route');
    const url = /^<(.+)>$/.exec((await mailTo(email))[0]!.headers['List-Unsubscribe']!)![1]!;
    // RFC 8058 §3.1: the mail client POSTs this exact body, form-encoded, with no cookie or other credentials.
    const oneClick = (target: string) =>
      POST(new Request(target, { method: 'POST', headers: { 'Content-Type': 'application/x-www-form-urlencoded' }, body: 'List-Unsubscribe=One-Click' }), undefined);
    currentUser = null;
    const response = await oneClick(url);
    expect(response.status).toBe(200);
    const answer = await response.json();
    expect((await entryOf(email, hare.id))!.state).toBe('left');
    // One entry only: the address's other waitlist stays.
    expect((await entryOf(email, ibex.id))!.state).toBe('pending');

    const { signToken } = await import('@/lib/waitlist/tokens');
    const unknown = await oneClick(`http://127.0.0.1:3000/api/waitlist/unsubscribe?t=${signToken('waitlist-unsubscribe', { e: randomUUID() })}`);
    expect(unknown.status).toBe(200);
    expect(await unknown.json()).toEqual(answer);

    const bad = await oneClick(`${url.slice(0, -3)}xyz`);
    expect(bad.status).toBe(400);
    expect((await bad.json()).error).toMatchObject({ code: 'damaged_link', message: expect.stringMatching(/damaged/) });
    const noBody = await POST(new Request(url, { method: 'POST', headers: { 'Content-Type': 'application/x-www-form-urlencoded' }, body: '' }), undefined);
    expect(noBody.status).toBe(400);
    expect((await noBody.json()).error.code).toBe('invalid_input');
  });

  it('a signed-in buyer leaves one entry or all of theirs, and nobody else’s', async () => {
    const email = 'thyme.owner@example.com';
    const owner = await buyer(email);
    await join(email, { user: owner, designIds: [hare.id, ibex.id] });
    await join('someone.else@example.com');
    const { leaveEntryOfUser, leaveAllOfUser } = await import('@/lib/waitlist/leave');
    const stranger = await entryOf('someone.else@example.com');
    await leaveEntryOfUser(owner, stranger!.id);
    expect((await entryOf('someone.else@example.com'))!.state).toBe('pending');
    await leaveEntryOfUser(owner, (await entryOf(email, hare.id))!.id);
    expect((await entryOf(email, hare.id))!.state).toBe('left');
    expect((await entryOf(email, ibex.id))!.state).toBe('pending');
    expect((await leaveAllOfUser(owner)).left).toBe(1);
    expect((await entryOf(email, ibex.id))!.state).toBe('left');
    const { listMyWaitlistEntries } = await import('@/lib/waitlist/queries');
    expect((await listMyWaitlistEntries({ user: owner })).map((e) => e.state)).toEqual(['left', 'left']);
  });
});

describe('rate limits', () => {
  it('refuse joins from one network past the limit with 429, Retry-After and words a person can act on', async () => {
    const { WAITLIST_LIMITS } = await import('@/lib/waitlist/join');
    const { POST } = await import('@/app/api/waitlist/route');
    currentUser = null;
    const ip = '203.0.113.50';
    const attempt = (i: number) =>
      POST(
        new Request('http://127.0.0.1:3000/api/waitlist', {
          method: 'POST',
          headers: { 'Content-Type': 'application/json', 'X-Real-IP': ip },
          body: JSON.stringify({ email: `spray${i}@example.com`, designIds: [hare.id], source: 'design_page' }),
        }),
        undefined,
      );
    // Far more than the limit at once, as a script would send them.
    const responses = await Promise.all(Array.from({ length: WAITLIST_LIMITS.perIp.points * 3 }, (_, i) => attempt(i)));
    const statuses = responses.map((r) => r.status);
    expect(statuses.filter((s) => s === 200)).toHaveLength(WAITLIST_LIMITS.perIp.points);
    expect(statuses.filter((s) => s === 429)).toHaveLength(WAITLIST_LIMITS.perIp.points * 2);
    const refused = responses.find((r) => r.status === 429)!;
    const retryAfter = Number(refused.headers.get('Retry-After'));
    expect(retryAfter).toBeGreaterThan(0);
    expect(retryAfter).toBeLessThanOrEqual(WAITLIST_LIMITS.perIp.duration);
    const body = await refused.json();
    expect(body.error.code).toBe('rate_limited');
    expect(body.error.message).toMatch(/try again in \d+ seconds?/);
    const [{ count }] = (await run<{ count: number }>(`SELECT count(*)::int AS count FROM waitlist_entries WHERE email LIKE 'spray%@example.com'`)) as [{ count: number }];
    expect(count).toBe(WAITLIST_LIMITS.perIp.points);
  });

  it('limit one address however many networks it comes from', async () => {
    const { WAITLIST_LIMITS } = await import('@/lib/waitlist/join');
    const email = 'flooded.visitor@example.com';
    for (let i = 0; i < WAITLIST_LIMITS.perAddress.points; i += 1) await join(email);
    await expect(join(email)).rejects.toMatchObject({ status: 429, code: 'rate_limited' });
  });

  it('a bad body is a 400 in the error shape, not a 500', async () => {
    const { POST } = await import('@/app/api/waitlist/route');
    const response = await POST(
      new Request('http://127.0.0.1:3000/api/waitlist', { method: 'POST', headers: { 'Content-Type': 'application/x-www-form-urlencoded' }, body: 'designIds=not-a-list' }),
      undefined,
    );
    expect(response.status).toBe(400);
    expect((await response.json()).error).toMatchObject({ code: 'invalid_input' });
  });
});

describe('early access', () => {
  let batchId: string;
  beforeAll(async () => {
    const [batch] = await run<{ id: string }>(
      `INSERT INTO batches (design_id, name, status, per_buyer_limit, hold_minutes, early_access_at, opens_at, closes_at, ship_by)
       VALUES ($1, 'Waitlist test batch', 'scheduled', 1, 10, now() + interval '1 hour', now() + interval '2 hours', now() + interval '1 day', current_date + 30)
       RETURNING id`,
      [hare.id],
    );
    batchId = batch!.id;
  });
  const tokenFor = async (forBatch: string, email: string) => {
    const { earlyAccessUrl } = await import('@/lib/waitlist/links');
    return new URL(earlyAccessUrl(forBatch, email)).searchParams.get('t')!;
  };
  const grants = (userId: string) => run(`SELECT 1 FROM early_access_grants WHERE batch_id = $1 AND user_id = $2`, [batchId, userId]);

  it('gives the grant to the owner of the address, once', async () => {
    const owner = await buyer('early.owner@example.com');
    const { redeemEarlyAccess } = await import('@/lib/waitlist/early-access');
    const token = await tokenFor(batchId, owner.email);
    expect((await redeemEarlyAccess(token, null)).outcome).toBe('sign_in');
    expect(await grants(owner.id)).toHaveLength(0);
    expect((await redeemEarlyAccess(token, owner, { batchId })).outcome).toBe('granted');
    expect((await redeemEarlyAccess(token, owner, { batchId })).outcome).toBe('granted');
    expect(await grants(owner.id)).toHaveLength(1);
  });

  it('refuses another account, naming the address only masked', async () => {
    const other = await buyer('early.other@example.com');
    const { redeemEarlyAccess } = await import('@/lib/waitlist/early-access');
    const result = await redeemEarlyAccess(await tokenFor(batchId, 'early.owner@example.com'), other);
    expect(result.outcome).toBe('wrong_account');
    if (result.outcome === 'wrong_account') {
      expect(result.maskedEmail).toMatch(/@example\.com$/);
      expect(result.maskedEmail).not.toContain('early.owner');
    }
    expect(await grants(other.id)).toHaveLength(0);
  });

  it('refuses a tampered link, a link moved to another batch, and a batch already open to everyone', async () => {
    const owner = await buyer('early.tamper@example.com');
    const { redeemEarlyAccess } = await import('@/lib/waitlist/early-access');
    const token = await tokenFor(batchId, owner.email);
    const [, mac] = token.split('.') as [string, string];
    // The same signature over a payload naming another address.
    const forged = `${Buffer.from(JSON.stringify({ b: batchId, a: 'early.tamper2@example.com' })).toString('base64url')}.${mac}`;
    expect((await redeemEarlyAccess(forged, owner)).outcome).toBe('damaged');
    expect((await redeemEarlyAccess(`${token}x`, owner)).outcome).toBe('damaged');
    expect((await redeemEarlyAccess(token, owner, { batchId: randomUUID() })).outcome).toBe('damaged');
    expect(await grants(owner.id)).toHaveLength(0);

    const [open] = await run<{ id: string }>(`SELECT id FROM batches WHERE name = 'Winter batch'`);
    expect((await redeemEarlyAccess(await tokenFor(open!.id, owner.email), owner)).outcome).toBe('already_public');
    await run(`UPDATE batches SET status = 'cancelled', cancelled_at = now() WHERE id = $1`, [batchId]);
    expect((await redeemEarlyAccess(token, owner)).outcome).toBe('cancelled');
    expect(await grants(owner.id)).toHaveLength(0);
  });
});
