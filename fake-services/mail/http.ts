import type { IncomingMessage, ServerResponse } from 'node:http';
import type { z } from 'zod';
import { BodyTooLarge, readBody, send, sendJson } from '../lib/http-io';
import { type FaultState, faultsSchema } from './faults';
import { inboxPage, messagePage, notFoundPage } from './pages';
import type { Inbox } from './store';

/*
 * The web side: the REST API tests read (shaped like the fields of the previous fake inbox that the
 * browser tests use), the control API for faults, and the two pages for people.
 */

export type MailContext = { inbox: Inbox; faults: FaultState };

/** The newest this many are drawn on the inbox page; the API returns all. */
const PAGE_LIMIT = 500;

// Pages never run scripts; the sandboxed iframe keeps a message's own HTML from doing so either. The srcdoc
// frame inherits this policy, so frame-ancestors must let the page frame it (with 'none' it stays blank).
const PAGE_HEADERS = {
  'Content-Type': 'text/html; charset=utf-8',
  'Content-Security-Policy': "script-src 'none'; object-src 'none'; base-uri 'none'; form-action 'none'; frame-ancestors 'self'",
  'X-Content-Type-Options': 'nosniff',
};

function sendError(res: ServerResponse, status: number, code: string, message: string, details?: unknown): void {
  sendJson(res, status, { error: { code, message, ...(details === undefined ? {} : { details }) } });
}

function describeIssues(issues: ReadonlyArray<z.core.$ZodIssue>): string {
  return issues.map((issue) => `${issue.path.join('.') || 'body'}: ${issue.message}`).join('; ');
}

async function handleFaults(ctx: MailContext, req: IncomingMessage, res: ServerResponse): Promise<void> {
  const body = (await readBody(req, 64 * 1024)).toString('utf8');
  let json: unknown = {};
  if (body.trim() !== '') {
    try {
      json = JSON.parse(body);
    } catch {
      return sendError(res, 400, 'invalid_json', 'The body must be JSON, for example {"refuse":{"code":451}}; {} clears the faults.');
    }
  }
  const parsed = faultsSchema.safeParse(json);
  if (!parsed.success) {
    return sendError(res, 400, 'invalid_faults', `The faults were not changed. ${describeIssues(parsed.error.issues)}`, {
      issues: parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })),
    });
  }
  sendJson(res, 200, ctx.faults.apply(parsed.data));
}

export async function handleRequest(ctx: MailContext, req: IncomingMessage, res: ServerResponse): Promise<void> {
  const method = req.method ?? 'GET';
  const url = new URL(req.url ?? '/', 'http://fake-mail.invalid');
  const path = url.pathname.replace(/\/+$/, '') || '/';
  try {
    if (method === 'GET' && path === '/api/email') {
      return sendJson(res, 200, ctx.inbox.list({ to: url.searchParams.get('to') ?? undefined }));
    }
    if (method === 'DELETE' && path === '/api/email/all') {
      const deleted = ctx.inbox.size;
      ctx.inbox.clear();
      return sendJson(res, 200, { deleted });
    }
    const one = /^\/api\/email\/([^/]+)$/.exec(path);
    if (one && method === 'GET') {
      const email = ctx.inbox.get(decodeURIComponent(one[1]!));
      if (!email) return sendError(res, 404, 'not_found', `No message ${one[1]} in the inbox; it may have been cleared.`);
      return sendJson(res, 200, email);
    }
    if (method === 'GET' && path === '/api/stats') return sendJson(res, 200, ctx.inbox.stats());
    if (method === 'GET' && path === '/_control/faults') return sendJson(res, 200, ctx.faults.current);
    if (method === 'POST' && path === '/_control/faults') return await handleFaults(ctx, req, res);
    if (method === 'POST' && path === '/_control/reset') {
      await readBody(req, 1024);
      ctx.inbox.clear();
      ctx.faults.reset();
      return sendJson(res, 200, { ok: true });
    }
    if (method === 'GET' && path === '/') {
      const all = ctx.inbox.list();
      return send(res, 200, inboxPage(all.slice(-PAGE_LIMIT).reverse(), all.length), PAGE_HEADERS);
    }
    const page = /^\/email\/([^/]+)$/.exec(path);
    if (page && method === 'GET') {
      const email = ctx.inbox.get(decodeURIComponent(page[1]!));
      return email ? send(res, 200, messagePage(email), PAGE_HEADERS) : send(res, 404, notFoundPage(), PAGE_HEADERS);
    }
    req.resume();
    sendError(res, 404, 'not_found', `The fake mail server has nothing at ${method} ${path}. See fake-services/mail/README.md.`);
  } catch (error) {
    if (error instanceof BodyTooLarge) return sendError(res, 413, 'body_too_large', 'The request body is too large.');
    if (error instanceof URIError) return sendError(res, 400, 'bad_path', 'The path is not valid percent-encoding.');
    console.error('[fake-mail] unexpected failure', error);
    sendError(res, 500, 'internal', 'The fake mail server failed unexpectedly.');
  }
}
