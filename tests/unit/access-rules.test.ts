import { describe, expect, it } from 'vitest';
import { actionRules, pageRules, routeRules } from '../fixtures/access-rules';
import { findPages, findRouteHandlers, findServerActions } from '../support/app-routes';

describe('every way into the app has an access rule', () => {
  it('pages', () => {
    expect(findPages()).toEqual(Object.keys(pageRules).sort());
  });

  it('route handlers, method by method', () => {
    const found = Object.fromEntries(findRouteHandlers().map((r) => [r.pattern, r.methods]));
    const ruled = Object.fromEntries(Object.entries(routeRules).map(([p, methods]) => [p, Object.keys(methods).sort()]));
    expect(found).toEqual(ruled);
  });

  it('server actions', () => {
    const found = findServerActions().map((a) => `${a.file}#${a.name}`).sort();
    expect(found).toEqual(Object.keys(actionRules).sort());
  });
});
