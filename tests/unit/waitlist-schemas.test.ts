import { describe, expect, it } from 'vitest';
import {
  canonicalTimeZone,
  joinWaitlistRequestSchema,
  leaveAllFormSchema,
  maskEmail,
  maxDesignsPerJoin,
  oneClickUnsubscribeSchema,
} from '@/lib/waitlist/schemas';

const ibex = '6f1c2c8e-3b7a-4d2e-9a51-0c6b1f2e7d01';
const hare = '6f1c2c8e-3b7a-4d2e-9a51-0c6b1f2e7d02';
const oldBone = '6f1c2c8e-3b7a-4d2e-9a51-0c6b1f2e7d03';

const fieldsOf = (result: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
  [...new Set((result.error?.issues ?? []).map((issue) => String(issue.path[0])))];

describe('joining a waitlist: the request', () => {
  it('normalises the address and drops repeated ids', () => {
    const parsed = joinWaitlistRequestSchema.parse({ email: '  Ines.Visitor@Example.COM ', designIds: [ibex, ibex, hare], finishIds: [oldBone, oldBone] });
    expect(parsed.email).toBe('ines.visitor@example.com');
    expect(parsed.designIds).toEqual([ibex, hare]);
    expect(parsed.finishIds).toEqual([oldBone]);
    expect(parsed.source).toBe('waitlist_page');
  });

  it('leaves finishes empty (any finish) and the address out for a signed-in buyer', () => {
    const parsed = joinWaitlistRequestSchema.parse({ designIds: [ibex] });
    expect(parsed.finishIds).toEqual([]);
    expect(parsed.email).toBeUndefined();
  });

  it(`asks for between one and ${maxDesignsPerJoin} designs, each an id`, () => {
    expect(fieldsOf(joinWaitlistRequestSchema.safeParse({ email: 'a@example.com', designIds: [] }))).toEqual(['designIds']);
    const tooMany = Array.from({ length: maxDesignsPerJoin + 1 }, (_, i) => `6f1c2c8e-3b7a-4d2e-9a51-0c6b1f2e7${String(i).padStart(3, '0')}`);
    expect(fieldsOf(joinWaitlistRequestSchema.safeParse({ email: 'a@example.com', designIds: tooMany }))).toEqual(['designIds']);
    expect(joinWaitlistRequestSchema.safeParse({ email: 'a@example.com', designIds: tooMany.slice(0, maxDesignsPerJoin) }).success).toBe(true);
    expect(fieldsOf(joinWaitlistRequestSchema.safeParse({ email: 'a@example.com', designIds: ['ibex'] }))).toEqual(['designIds']);
    // A form post sends one string, not a list: refused with a message, never a crash.
    expect(fieldsOf(joinWaitlistRequestSchema.safeParse({ email: 'a@example.com', designIds: ibex }))).toEqual(['designIds']);
  });

  it('refuses a bad address with the shared address checker’s words', () => {
    const result = joinWaitlistRequestSchema.safeParse({ email: 'ines.example.com', designIds: [ibex] });
    expect(result.success).toBe(false);
    expect(result.error?.issues[0]?.message).toMatch(/needs an @/);
  });

  it('takes only the sources of the shop’s own pages: an import is never a visitor’s doing', () => {
    expect(joinWaitlistRequestSchema.parse({ designIds: [ibex], source: 'drop_page' }).source).toBe('drop_page');
    expect(fieldsOf(joinWaitlistRequestSchema.safeParse({ designIds: [ibex], source: 'import' }))).toEqual(['source']);
  });
});

describe('the browser’s time zone', () => {
  it('keeps IANA names Intl knows, in their canonical spelling', () => {
    expect(joinWaitlistRequestSchema.parse({ designIds: [ibex], timeZone: 'Europe/Dublin' }).timeZone).toBe('Europe/Dublin');
    // ECMA-402 (§6.5.2, IsTimeZoneAvailable / GetAvailableNamedTimeZone): zone names match case-insensitively
    // and come back in their canonical case.
    expect(canonicalTimeZone('europe/dublin')).toBe('Europe/Dublin');
    // Three-part names are accepted (the spelling Intl returns for links is its own business).
    expect(canonicalTimeZone('America/Argentina/Buenos_Aires')).not.toBeNull();
  });

  it('treats an empty zone as none and refuses zones that do not exist or are bare offsets', () => {
    expect(joinWaitlistRequestSchema.parse({ designIds: [ibex], timeZone: '' }).timeZone).toBeUndefined();
    expect(fieldsOf(joinWaitlistRequestSchema.safeParse({ designIds: [ibex], timeZone: 'Mars/Olympus_Mons' }))).toEqual(['timeZone']);
    expect(canonicalTimeZone('+02:00')).toBeNull();
    expect(canonicalTimeZone('Europe/Dublin; DROP TABLE')).toBeNull();
    expect(canonicalTimeZone('x'.repeat(80))).toBeNull();
  });
});

describe('the one-click unsubscribe body', () => {
  it('is exactly List-Unsubscribe=One-Click (RFC 8058 §3.1), with our own optional scope', () => {
    const body = Object.fromEntries(new URLSearchParams('List-Unsubscribe=One-Click'));
    expect(oneClickUnsubscribeSchema.parse(body)).toEqual({ 'List-Unsubscribe': 'One-Click', scope: 'entry' });
    expect(oneClickUnsubscribeSchema.parse({ ...body, scope: 'all' }).scope).toBe('all');
    expect(oneClickUnsubscribeSchema.safeParse({ 'List-Unsubscribe': 'one-click' }).success).toBe(false);
    expect(oneClickUnsubscribeSchema.safeParse({}).success).toBe(false);
    expect(oneClickUnsubscribeSchema.safeParse({ ...body, scope: 'everything' }).success).toBe(false);
  });
});

describe('leaving every waitlist from the account page', () => {
  it('must be asked for by name: an empty form leaves nothing', () => {
    expect(leaveAllFormSchema.safeParse({}).success).toBe(false);
    expect(leaveAllFormSchema.safeParse({ scope: 'all' }).success).toBe(true);
  });
});

describe('masking an address', () => {
  it('shows enough for its owner to recognise and hides the rest of the local part', () => {
    expect(maskEmail('wrenna@example.com')).toBe('wr•••@example.com');
    expect(maskEmail('jo@example.com')).toBe('j•••@example.com');
    expect(maskEmail('wrenna@example.com')).not.toContain('wrenna');
  });
});
