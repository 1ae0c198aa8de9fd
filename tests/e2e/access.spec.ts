import { expect, request as playwrightRequest, test } from '@playwright/test';
import { hasRole, type Role } from '@/lib/auth/roles';
import { pageRules, routeRules, type Access } from '../fixtures/access-rules';
import { signInAs } from './support/auth';
import { withDb } from './support/db';

// The role matrix over real HTTP: every page and route handler, as anonymous, buyer, studio hand and maker.
const callers: (Role | 'anonymous')[] = ['anonymous', 'customer', 'staff', 'owner'];
const allowed = (access: Access, caller: Role | 'anonymous') =>
  access === 'public' || (caller !== 'anonymous' && hasRole(caller, access));

// A request the route answers without side effects, for each route handler and method.
const routeProbes: Record<string, Record<string, { path: string; expect: number; body?: object }>> = {
  '/api/health': { GET: { path: '/api/health', expect: 200 } },
  '/api/auth/[...nextauth]': {
    GET: { path: '/api/auth/csrf', expect: 200 },
    POST: { path: '/api/auth/signin/email', expect: 400, body: { email: 'not-an-address' } },
  },
  '/api/auth/demo': { POST: { path: '/api/auth/demo', expect: 422, body: { email: 'stranger@example.com' } } },
  '/api/drops/[batchId]/availability': {
    GET: { path: '/api/drops/00000000-0000-4000-8000-000000000000/availability', expect: 404 },
  },
  '/api/holds': { POST: { path: '/api/holds', expect: 400, body: { batchId: 'not-a-uuid' } } },
  '/api/holds/[id]': { DELETE: { path: '/api/holds/00000000-0000-4000-8000-000000000000', expect: 404 } },
  '/api/holds/mine': { GET: { path: '/api/holds/mine', expect: 200 } },
  '/api/checkout': { POST: { path: '/api/checkout', expect: 400, body: { holdId: 'not-a-uuid' } } },
  '/api/checkout/options': { GET: { path: '/api/checkout/options?holdId=not-a-uuid', expect: 400 } },
  '/api/webhooks/stripe': { POST: { path: '/api/webhooks/stripe', expect: 400, body: { id: 'evt_forged' } } },
  '/api/orders/[number]': { GET: { path: '/api/orders/DM-0000', expect: 404 } },
  '/api/waitlist': { POST: { path: '/api/waitlist', expect: 400, body: { designIds: 'not-a-list' } } },
  '/api/waitlist/unsubscribe': { POST: { path: '/api/waitlist/unsubscribe?t=forged', expect: 400, body: { 'List-Unsubscribe': 'One-Click' } } },
  '/api/waitlist/confirm': { POST: { path: '/api/waitlist/confirm', expect: 400, body: { t: 'forged' } } },
  '/api/waitlist/resend': { POST: { path: '/api/waitlist/resend', expect: 400, body: { t: 'forged' } } },
  '/api/workshop/orders': { GET: { path: '/api/workshop/orders?perPage=10', expect: 200 } },
  '/api/workshop/orders/export': { GET: { path: '/api/workshop/orders/export?state=refunded', expect: 200 } },
  '/api/workshop/waitlist/progress': { GET: { path: '/api/workshop/waitlist/progress', expect: 200 } },
  '/api/workshop/waitlist/export': { GET: { path: '/api/workshop/waitlist/export?state=left', expect: 200 } },
  '/api/workshop/orders/packing-slips': { GET: { path: '/api/workshop/orders/packing-slips?number=DM-0000', expect: 404 } },
  '/api/uploadthing': {
    GET: { path: '/api/uploadthing', expect: 200 },
    POST: { path: '/api/uploadthing', expect: 400 },
  },
  '/media/[...path]': { GET: { path: '/media/00000000000000000000000000000000/320.webp', expect: 404 } },
};

test.describe('who may open what', () => {
  for (const caller of callers) {
    test(`as ${caller}`, async ({ baseURL }) => {
      const request = await playwrightRequest.newContext({ baseURL });
      const openBatch = await withDb(async (db) => (await db.query(`SELECT id FROM batches WHERE name = 'Winter batch'`)).rows[0].id as string);
      if (caller !== 'anonymous') await signInAs(request, caller);

      for (const [pattern, rule] of Object.entries(pageRules)) {
        const response = await request.get((rule.example ?? pattern).replace(':open-batch', openBatch), { maxRedirects: 0 });
        const expected = allowed(rule.access, caller) ? (rule.status ?? 200) : caller === 'anonymous' ? 307 : 403;
        // The sign-in page sends someone already signed in on to their account.
        const status = pattern === '/sign-in' && caller !== 'anonymous' && response.status() === 307 ? 200 : response.status();
        expect(status, `${caller} GET ${pattern}`).toBe(expected);
        if (expected === 307) expect(response.headers().location).toContain('/sign-in?callbackUrl=');
      }

      for (const [pattern, methods] of Object.entries(routeRules)) {
        for (const [method, access] of Object.entries(methods)) {
          const probe = routeProbes[pattern]?.[method];
          expect(probe, `a probe for ${method} ${pattern}`).toBeDefined();
          const response = await request.fetch(probe!.path, { method, form: probe!.body as Record<string, string> | undefined, maxRedirects: 0 });
          const expected = allowed(access, caller) ? probe!.expect : caller === 'anonymous' ? 401 : 403;
          expect(response.status(), `${caller} ${method} ${pattern}`).toBe(expected);
          if (response.status() >= 400) {
            const body = await response.json();
            expect(body.error.code).toMatch(/^[a-z_]+$/);
            expect(body.error.message.length).toBeGreaterThan(10);
          }
        }
      }
      await request.dispose();
    });
  }
});
