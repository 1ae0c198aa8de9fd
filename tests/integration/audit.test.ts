import { renderToStaticMarkup } from 'react-dom/server';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import type { CurrentUser } from '@/lib/auth/session';
import { pay, waitUntil, withCheckoutWorld } from './orders/support';

// The page is rendered as the signed-in person; Next's data cache is only there inside a running server.
let currentUser: CurrentUser | null = null;
vi.mock('@/lib/auth/session', () => ({ getCurrentUser: async () => currentUser }));
vi.mock('next/cache', async (importOriginal) => ({
  ...(await importOriginal<typeof import('next/cache')>()),
  unstable_cache: <T>(fn: T) => fn,
}));

// The audit log against a seeded database and the fake Stripe: each kind of workshop change writes its
// entry in its own transaction, and the table itself refuses to be edited.
const world = withCheckoutWorld('audit');

type Entry = {
  id: string;
  actor_user_id: string | null;
  actor_label: string;
  action: string;
  subject_type: string;
  subject_id: string;
  summary: string;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
};

const entriesFor = (subjectId: string) =>
  world.rows<Entry>(`SELECT id::text, actor_user_id, actor_label, action, subject_type, subject_id, summary, before, after FROM audit_log WHERE subject_id = $1 ORDER BY audit_log.id`, [subjectId]);

const auditCount = async () => Number((await world.rows<{ n: number }>(`SELECT count(*)::int AS n FROM audit_log`))[0]!.n);

async function sqlError(text: string, params: unknown[] = []): Promise<string> {
  try {
    await world.rows(text, params);
  } catch (error) {
    return (error as Error).message;
  }
  throw new Error(`expected the database to refuse: ${text}`);
}

let owner: CurrentUser;
beforeAll(async () => {
  // A person with a real name, as the log shows it.
  const [row] = await world.rows<{ id: string; email: string }>(`INSERT INTO users (email, name, role) VALUES ('fen@audit.example', 'Fen Alder', 'owner') RETURNING id, email`);
  owner = { id: row!.id, email: row!.email, name: 'Fen Alder', role: 'owner' };
});

async function person(email: string, name: string, role: 'customer' | 'staff' | 'owner'): Promise<CurrentUser> {
  const [row] = await world.rows<{ id: string }>(`INSERT INTO users (email, name, role) VALUES ($1, $2, $3) RETURNING id`, [email, name, role]);
  return { id: row!.id, email, name, role };
}

async function designId(slug: string): Promise<string> {
  const [row] = await world.rows<{ id: string }>(`SELECT id FROM designs WHERE slug = $1`, [slug]);
  return row!.id;
}

describe('refunds', () => {
  it('logs the owner’s refund with the amounts before and after, under their name', async () => {
    const { createHold } = await import('@/lib/drops/holds');
    const { startCheckout } = await import('@/lib/orders/checkout');
    const { refundOrder } = await import('@/lib/orders/refunds');
    const { formatMoney } = await import('@/lib/money');
    const batch = await world.freshBatch(4, { perBuyerLimit: 2 });
    const buyer = await world.buyer('audit-buyer@example.com');
    const hold = await createHold(buyer, { batchId: batch.batchId, finishId: batch.finishId, quantity: 2 });
    const checkout = await startCheckout(buyer, { holdId: hold.id, country: 'IE', shippingRateId: await world.irishRate(buyer, hold.id) });
    await pay(world.fake(), checkout.url);
    const order = (await waitUntil(() => world.order(hold.id), (o) => o?.state === 'paid'))!;
    const [line] = await world.rows<{ id: string; unit_price_minor: number }>(`SELECT id, unit_price_minor FROM order_lines WHERE order_id = $1 ORDER BY position LIMIT 1`, [order.id]);

    const refund = await refundOrder(owner, { mode: 'lines', orderId: order.id, lineIds: [line!.id], reason: 'failed_casting', note: '', restock: false });
    expect(refund.status).toBe('succeeded');
    const [entry, ...more] = await entriesFor(order.id);
    expect(more).toEqual([]);
    expect(entry).toMatchObject({ action: 'order.refunded', subject_type: 'order', actor_user_id: owner.id, actor_label: 'Fen Alder' });
    expect(entry!.summary).toBe(`Refunded ${formatMoney({ amountMinor: line!.unit_price_minor, currency: 'EUR' })} of ${order.number} (1 mask)`);
    expect(entry!.before).toMatchObject({ currency: 'EUR', refundedMinor: 0, leftToRefundMinor: order.paid_minor });
    expect(entry!.after).toMatchObject({ refundedMinor: line!.unit_price_minor, leftToRefundMinor: order.paid_minor - line!.unit_price_minor, masks: 1 });

    // A refund refused before anything is recorded leaves no entry either.
    await expect(
      refundOrder(owner, { mode: 'amount', orderId: order.id, amountMinor: order.paid_minor, reason: 'other', note: '', restock: false }),
    ).rejects.toMatchObject({ code: 'amount_too_large' });
    expect(await entriesFor(order.id)).toHaveLength(1);

    // When Stripe refuses a refund, the log says that no money went back.
    await world.rows(`UPDATE orders SET paid_minor = paid_minor + 1000 WHERE id = $1`, [order.id]);
    await expect(
      refundOrder(owner, { mode: 'amount', orderId: order.id, amountMinor: order.paid_minor - line!.unit_price_minor + 1000, reason: 'other', note: '', restock: false }),
    ).rejects.toMatchObject({ code: 'refund_refused' });
    const [, requested, refused] = await entriesFor(order.id);
    expect(requested).toMatchObject({ action: 'order.refunded' });
    expect(refused).toMatchObject({ action: 'order.refund_failed', actor_user_id: null, actor_label: 'Demold (automatic)', after: { refundStatus: 'failed' } });
    expect(refused!.summary).toMatch(new RegExp(`^Stripe refused the refund of .+ of ${order.number}: nothing was paid back$`));

    // The page's before/after reads as money.
    const { diffEntry } = await import('@/lib/audit/diff');
    expect(diffEntry(entry!.before, entry!.after)).toContainEqual({
      key: 'refundedMinor',
      label: 'Refunded',
      before: formatMoney({ amountMinor: 0, currency: 'EUR' }),
      after: formatMoney({ amountMinor: line!.unit_price_minor, currency: 'EUR' }),
      changed: true,
    });
  });
});

describe('oversold decisions', () => {
  it('logs the owner’s confirmation that an extra is cast, with the stock before and after', async () => {
    const { createHold, expireHolds } = await import('@/lib/drops/holds');
    const { startCheckout } = await import('@/lib/orders/checkout');
    const { confirmExtraCast } = await import('@/lib/orders/refunds');
    const batch = await world.freshBatch(1);
    const late = await world.buyer('audit-late@example.com');
    const hold = await createHold(late, { batchId: batch.batchId, finishId: batch.finishId, quantity: 1 });
    const checkout = await startCheckout(late, { holdId: hold.id, country: 'IE', shippingRateId: await world.irishRate(late, hold.id) });
    await world.rows(`UPDATE holds SET expires_at = now() - interval '1 second' WHERE id = $1`, [hold.id]);
    await expireHolds();
    // Someone else takes the last mask, then the first buyer's payment lands.
    const quick = await world.buyer('audit-quick@example.com');
    const other = await createHold(quick, { batchId: batch.batchId, finishId: batch.finishId, quantity: 1 });
    await pay(world.fake(), (await startCheckout(quick, { holdId: other.id, country: 'IE', shippingRateId: await world.irishRate(quick, other.id) })).url);
    await waitUntil(() => world.order(other.id), (o) => o?.state === 'paid');
    await pay(world.fake(), checkout.url);
    const order = (await waitUntil(() => world.order(hold.id), (o) => o?.state === 'paid'))!;
    const [line] = await world.rows<{ id: string }>(`SELECT id FROM order_lines WHERE order_id = $1 AND oversold`, [order.id]);

    await confirmExtraCast(owner, line!.id);
    const [entry, ...more] = await entriesFor(order.id);
    expect(more).toEqual([]);
    expect(entry).toMatchObject({
      action: 'order.extra_cast_confirmed',
      summary: `Confirmed an extra Ibex — Old Bone will be cast for ${order.number}`,
      before: { quantity: 1, sold: 1 },
      after: { quantity: 2, sold: 2 },
    });
  });
});

describe('people', () => {
  it('logs an invitation and a change of role in the studio’s words', async () => {
    const { changeStudioRole, invitePerson, removeFromStudio } = await import('@/lib/auth/people');
    const { person: kit } = await invitePerson(owner, { email: 'kit@audit.example', name: 'Kit Sorrel', role: 'staff' });
    await changeStudioRole(owner, { userId: kit.id, role: 'owner' });
    await removeFromStudio(owner, { userId: kit.id });
    const entries = await entriesFor(kit.id);
    expect(entries.map((e) => [e.action, e.summary])).toEqual([
      ['person.invited', 'Invited Kit Sorrel (kit@audit.example) as studio hand'],
      ['person.role_changed', 'Changed Kit Sorrel from studio hand to maker (owner)'],
      ['person.removed', 'Removed Kit Sorrel (maker (owner)) from the studio'],
    ]);
    expect(entries[1]).toMatchObject({ before: { role: 'staff' }, after: { role: 'owner' }, actor_label: 'Fen Alder' });
    // Giving someone the role they already have changes nothing and logs nothing.
    await changeStudioRole(owner, { userId: owner.id, role: 'owner' });
    expect(await entriesFor(owner.id)).toEqual([]);
  });

  it('a change that fails at commit takes its entry with it', async () => {
    const { changeStudioRole } = await import('@/lib/auth/people');
    const hand = await person('rook@audit.example', 'Rook Tamsin', 'staff');
    // A deferred check on users that fails at commit, after the entry was written in the same transaction.
    await world.rows(`CREATE FUNCTION test_refuse_rook() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN RAISE EXCEPTION 'refused for the test'; END $$`);
    await world.rows(
      `CREATE CONSTRAINT TRIGGER test_refuse_rook AFTER UPDATE ON users DEFERRABLE INITIALLY DEFERRED
         FOR EACH ROW WHEN (NEW.email = 'rook@audit.example') EXECUTE FUNCTION test_refuse_rook()`,
    );
    try {
      const before = await auditCount();
      await expect(changeStudioRole(owner, { userId: hand.id, role: 'owner' })).rejects.toThrow(/refused for the test/);
      expect(await auditCount()).toBe(before);
      expect((await world.rows<{ role: string }>(`SELECT role FROM users WHERE id = $1`, [hand.id]))[0]!.role).toBe('staff');
    } finally {
      await world.rows(`DROP TRIGGER test_refuse_rook ON users; DROP FUNCTION test_refuse_rook()`);
    }
  });
});

describe('batches', () => {
  it('logs scheduling with the stock before and after, and a cancellation', async () => {
    const { cancelBatch, saveBatch } = await import('@/lib/drops/batches');
    const ibex = await designId('ibex');
    const [finish] = await world.rows<{ id: string; name: string }>(`SELECT id, name FROM finishes WHERE design_id = $1 AND slug = 'old-bone'`, [ibex]);
    const day = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);
    const form = (quantity: number, batchId?: string) => ({
      batchId,
      earlyAccessAt: undefined,
      plannedShipBy: undefined,
      designId: ibex,
      name: 'Audit batch',
      announcement: '',
      perBuyerLimit: 1,
      holdMinutes: 10,
      opensAt: `${day(10)}T19:00`,
      closesAt: `${day(12)}T19:00`,
      shipBy: day(60),
      intent: 'schedule' as const,
      quantities: { [finish!.id]: quantity },
    });
    const created = await saveBatch(owner, form(12));
    await saveBatch(owner, form(15, created.batchId));
    await cancelBatch(owner, created.batchId);
    const entries = await entriesFor(created.batchId);
    expect(entries.map((e) => [e.action, e.summary])).toEqual([
      ['batch.saved', 'Scheduled Audit batch of Ibex (12 masks)'],
      ['batch.saved', 'Scheduled Audit batch of Ibex (15 masks)'],
      ['batch.cancelled', 'Cancelled Audit batch'],
    ]);
    expect(entries[0]).toMatchObject({ before: null, after: { status: 'scheduled', stock: { [finish!.name]: 12 } } });
    expect(entries[1]).toMatchObject({ before: { status: 'scheduled', stock: { [finish!.name]: 12 } }, after: { stock: { [finish!.name]: 15 } } });
    expect(entries[2]).toMatchObject({ before: { status: 'scheduled' }, after: { status: 'cancelled' } });
  });
});

const designFields = {
  currency: 'EUR',
  name: 'Heron',
  slug: 'heron-audit',
  summary: 'A long beak.',
  basePrice: '240.50',
  parcelLengthMm: '450',
  parcelWidthMm: '300',
  parcelHeightMm: '250',
  parcelWeightG: '1400',
};

describe('designs and finishes', () => {
  it('logs a price change and a status change, and nothing when the price stays', async () => {
    const editing = await import('@/lib/catalogue/editing');
    const fields = designFields;
    const design = await editing.createDesign(editing.designFormSchema.parse(fields));
    const update = (basePrice: string, summary = fields.summary) =>
      editing.updateDesign(owner, editing.designUpdateSchema.parse({ ...fields, designId: design.designId, basePrice, summary }));
    await update('260');
    await update('260', 'A long beak and a longer neck.');
    const finish = await editing.addFinish(
      editing.finishFormSchema.parse({ designId: design.designId, currency: 'EUR', name: 'Slate', priceDifference: '0', paintHours: '2' }),
    );
    await editing.updateFinish(
      owner,
      editing.finishUpdateSchema.parse({ finishId: finish.finishId, currency: 'EUR', name: 'Slate', slug: 'slate', priceDifference: '35', paintHours: '2' }),
    );
    await editing.setFinishStatus(owner, { finishId: finish.finishId, status: 'published' });

    const designEntries = await entriesFor(design.designId);
    expect(designEntries.map((e) => [e.action, e.summary])).toEqual([['design.price_changed', 'Changed the price of Heron from €240.50 to €260.00']]);
    expect(designEntries[0]).toMatchObject({ before: { basePriceMinor: 24050 }, after: { basePriceMinor: 26000 } });
    expect((await entriesFor(finish.finishId)).map((e) => [e.action, e.summary])).toEqual([
      ['finish.price_changed', 'Changed the price difference of Heron — Slate from +€0.00 to +€35.00'],
      ['finish.status_changed', 'Published Heron — Slate'],
    ]);
  });

  it('a change whose entry cannot be written is not made', async () => {
    const editing = await import('@/lib/catalogue/editing');
    const fields = { ...designFields, name: 'Egret', slug: 'egret-audit' };
    const design = await editing.createDesign(editing.designFormSchema.parse(fields));
    const input = editing.designUpdateSchema.parse({ ...fields, designId: design.designId, basePrice: '300' });
    const price = async () => (await world.rows<{ base_price_minor: number }>(`SELECT base_price_minor FROM designs WHERE id = $1`, [design.designId]))[0]!.base_price_minor;
    await world.rows(`ALTER TABLE audit_log ADD CONSTRAINT test_no_price_entries CHECK (action <> 'design.price_changed') NOT VALID`);
    try {
      await expect(editing.updateDesign(owner, input)).rejects.toMatchObject({ original: { constraint: 'test_no_price_entries' } });
      expect(await price()).toBe(24050);
    } finally {
      await world.rows(`ALTER TABLE audit_log DROP CONSTRAINT test_no_price_entries`);
    }
    // The same change goes through once its entry can be written.
    await editing.updateDesign(owner, input);
    expect(await price()).toBe(30000);
    expect(await entriesFor(design.designId)).toHaveLength(1);
  });
});

describe('molds', () => {
  it('logs adding a mold, its pulls and retiring it', async () => {
    const { addMold, recordPulls, retireMold } = await import('@/lib/molds/molds');
    const mold = await addMold(owner, { designId: await designId('hare'), label: 'Hare Audit', madeOn: '2026-11-02', pullsSoFar: 4, expectedLifePulls: 40, notes: '' });
    await recordPulls(owner, { moldId: mold.id, pulls: 3 });
    await retireMold(owner, { moldId: mold.id });
    const entries = await entriesFor(mold.id);
    expect(entries.map((e) => [e.action, e.summary])).toEqual([
      ['mold.added', 'Added Hare Audit for Hare (4 pulls of 40 used)'],
      ['mold.pulls_recorded', 'Recorded 3 pulls on Hare Audit (7 of 40)'],
      ['mold.retired', 'Retired Hare Audit after 7 pulls of 40'],
    ]);
    expect(entries[1]).toMatchObject({ before: { pullsSoFar: 4 }, after: { pullsSoFar: 7 } });
  });
});

describe('the table', () => {
  it('refuses UPDATE, DELETE and TRUNCATE, and nulling an actor who still exists', async () => {
    const [entry] = await world.rows<{ id: string }>(`SELECT id::text FROM audit_log WHERE actor_user_id IS NOT NULL ORDER BY audit_log.id LIMIT 1`);
    expect(entry).toBeDefined();
    expect(await sqlError(`UPDATE audit_log SET summary = 'Nothing happened' WHERE id = $1`, [entry!.id])).toMatch(/append-only/);
    expect(await sqlError(`DELETE FROM audit_log WHERE id = $1`, [entry!.id])).toMatch(/append-only/);
    expect(await sqlError(`TRUNCATE audit_log`)).toMatch(/append-only/);
    expect(await sqlError(`UPDATE audit_log SET actor_user_id = NULL WHERE id = $1`, [entry!.id])).toMatch(/append-only/);
    expect(await world.rows(`SELECT 1 FROM audit_log WHERE id = $1 AND actor_user_id IS NOT NULL`, [entry!.id])).toHaveLength(1);
  });

  it('keeps a deleted person’s entries, under their name', async () => {
    const { addMold } = await import('@/lib/molds/molds');
    const { listAudit } = await import('@/lib/audit/log');
    const wren = await person('wren@audit.example', 'Wren Hollis', 'owner');
    const mold = await addMold(wren, { designId: await designId('moth'), label: 'Moth Audit', madeOn: '2026-10-02', pullsSoFar: 0, expectedLifePulls: 30, notes: '' });
    await world.rows(`DELETE FROM users WHERE id = $1`, [wren.id]);
    const [entry] = await entriesFor(mold.id);
    expect(entry).toMatchObject({ action: 'mold.added', actor_user_id: null, actor_label: 'Wren Hollis' });
    const { entries } = await listAudit({ subject: { type: 'mold', id: mold.id } });
    expect(entries).toMatchObject([{ actorUserId: null, actorLabel: 'Wren Hollis', summary: entry!.summary }]);
  });

  it('pages newest first, without repeating or skipping an entry', async () => {
    const { listAudit } = await import('@/lib/audit/log');
    const all = await world.rows<{ id: string }>(`SELECT id::text FROM audit_log ORDER BY audit_log.id DESC`);
    // Past 9, so the order is by number and not by text ("10" < "9").
    expect(all.length).toBeGreaterThan(10);
    const seen: string[] = [];
    let before: string | undefined;
    for (;;) {
      const page = await listAudit({ limit: 4, before });
      seen.push(...page.entries.map((e) => e.id));
      if (!page.olderBefore) break;
      before = page.olderBefore;
    }
    expect(seen).toEqual(all.map((row) => row.id));
  });

  it('shows staff the newest entries first with who, when and the before and after; a made-up page is a 404', async () => {
    const { default: AuditPage } = await import('@/app/workshop/audit/page');
    currentUser = await person('hazel@audit.example', 'Hazel Pike', 'staff');
    const [newest] = await world.rows<{ id: string; summary: string }>(`SELECT id::text, summary FROM audit_log ORDER BY audit_log.id DESC LIMIT 1`);
    const html = renderToStaticMarkup(await AuditPage({ searchParams: Promise.resolve({}) }));
    expect(html).toContain('Audit log');
    expect(html.indexOf('Changed Kit Sorrel from studio hand to maker (owner)')).toBeGreaterThan(-1);
    expect(html.indexOf('Changed Kit Sorrel from studio hand to maker (owner)')).toBeLessThan(html.indexOf('Refunded '));
    expect(html.indexOf(newest!.summary)).toBeLessThan(html.indexOf('Refunded '));
    expect(html).toContain('Wren Hollis<span class="text-ink-faint"> (account since deleted)</span>');
    expect(html).toMatch(/<details[^>]*><summary[^>]*>Before and after<\/summary>/);
    expect(html).toContain('Europe/Dublin');
    // Fewer than a page of entries: no link to older ones.
    expect(html).not.toContain('Older entries');

    const oldest = renderToStaticMarkup(await AuditPage({ searchParams: Promise.resolve({ before: '1' }) }));
    expect(oldest).toContain('There are no older entries.');
    await expect(AuditPage({ searchParams: Promise.resolve({ before: 'abc' }) })).rejects.toMatchObject({ digest: expect.stringMatching(/404/) });
  });
});
