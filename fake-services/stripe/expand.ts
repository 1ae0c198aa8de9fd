import { snapshot, type FakeContext } from './context';
import { paramError, StripeHttpError } from './stripe-errors';

/*
 * `expand[]`: a dotted path names an id field to replace with the object it points at, and may go on
 * inside that object (`payment_intent.latest_charge`). On a list, paths start with `data.`. A Checkout
 * Session's `line_items` exist only when expanded, as on Stripe. Stripe allows four levels.
 */

const MAX_DEPTH = 4;

type Json = Record<string, unknown>;

function cannotExpand(part: string, index: number): StripeHttpError {
  return paramError(`This property cannot be expanded (${part}).`, `expand[${index}]`);
}

function expandPath(ctx: FakeContext, node: Json, parts: string[], index: number): void {
  const [head, ...rest] = parts;
  if (head === undefined) return;
  // Only the object's own fields: `__proto__` or `constructor` in a path must lead nowhere.
  let value = Object.hasOwn(node, head) ? node[head] : undefined;
  if (
    value === undefined &&
    head === 'line_items' &&
    node.object === 'checkout.session' &&
    typeof node.id === 'string'
  ) {
    value = lineItemsList(ctx, node.id);
    node[head] = value;
  }
  if (value === undefined) throw cannotExpand(head, index);
  if (value === null) return;
  const resolve = (item: unknown): unknown => {
    if (typeof item !== 'string') return item;
    const found = ctx.state.lookup(item);
    if (!found) throw cannotExpand(head, index);
    return snapshot(found.object);
  };
  if (Array.isArray(value)) {
    node[head] = value.map((item) => {
      const resolved = rest.length === 0 ? resolve(item) : item;
      if (rest.length && resolved && typeof resolved === 'object')
        expandPath(ctx, resolved as Json, rest, index);
      return resolved;
    });
    return;
  }
  const resolved = resolve(value);
  if (resolved === null || typeof resolved !== 'object') throw cannotExpand(head, index);
  node[head] = resolved;
  if (rest.length) expandPath(ctx, resolved as Json, rest, index);
}

/** A copy of the object with the requested fields expanded; the stored object is never touched. */
export function render(ctx: FakeContext, object: unknown, expand: string[] | undefined): unknown {
  const copy = snapshot(object) as Json;
  (expand ?? []).forEach((path, index) => {
    const parts = path.split('.');
    if (parts.length > MAX_DEPTH || parts.some((p) => p === '')) {
      throw paramError(
        `You cannot expand more than ${MAX_DEPTH} levels of a property (${path}).`,
        `expand[${index}]`,
      );
    }
    expandPath(ctx, copy, parts, index);
  });
  return copy;
}

export interface ListParams {
  limit?: number;
  starting_after?: string;
  ending_before?: string;
}

/** Stripe's list object over items sorted newest first, with cursor pagination by id. */
export function listObject<T extends { id: string }>(items: T[], params: ListParams, url: string) {
  if (params.starting_after && params.ending_before) {
    throw paramError(
      'You may only specify one of these parameters: ending_before, starting_after.',
      'starting_after',
    );
  }
  const limit = params.limit ?? 10;
  let start = 0;
  let end = items.length;
  if (params.starting_after) {
    const at = items.findIndex((item) => item.id === params.starting_after);
    if (at < 0)
      throw paramError(`No such object: '${params.starting_after}'`, 'starting_after', 'resource_missing');
    start = at + 1;
  }
  if (params.ending_before) {
    const at = items.findIndex((item) => item.id === params.ending_before);
    if (at < 0)
      throw paramError(`No such object: '${params.ending_before}'`, 'ending_before', 'resource_missing');
    end = at;
    start = Math.max(0, end - limit);
  }
  const page = items.slice(start, Math.min(end, start + limit));
  const hasMore = params.ending_before ? start > 0 : start + limit < end;
  return { object: 'list' as const, data: page, has_more: hasMore, url };
}

export function lineItemsList(ctx: FakeContext, sessionId: string, params: ListParams = {}) {
  const record = ctx.state.sessions.get(sessionId);
  // Line items are listed in the order they were given, not newest first.
  return listObject(record?.lineItems ?? [], params, `/v1/checkout/sessions/${sessionId}/line_items`);
}
