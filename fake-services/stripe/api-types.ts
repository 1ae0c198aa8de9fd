import type { FakeContext, Origin } from './context';
import type { FormObject } from './form-params';

/** A /v1 request after authentication: the parsed form body (POST) or query string (GET). */
export interface ApiRequest {
  method: string;
  path: string;
  /** The pattern's captures, e.g. the session id of /v1/checkout/sessions/:id. */
  pathParams: string[];
  params: FormObject;
  apiKey: string;
  idempotencyKey: string | null;
  stripeVersion: string;
  requestId: string;
}

export interface ApiResponse {
  status: number;
  body: unknown;
}

export type Handler = (ctx: FakeContext, req: ApiRequest) => ApiResponse;

export interface Route {
  method: 'GET' | 'POST';
  pattern: RegExp;
  handler: Handler;
}

export const originOf = (req: ApiRequest): Origin => ({
  requestId: req.requestId,
  idempotencyKey: req.idempotencyKey,
  apiVersion: req.stripeVersion,
});

export const ok = (body: unknown): ApiResponse => ({ status: 200, body });

export function pathParam(req: ApiRequest, index = 0): string {
  return decodeURIComponent(req.pathParams[index] ?? '');
}
