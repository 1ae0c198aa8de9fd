/** The body Stripe answers with when something goes wrong: `{ "error": { ... } }`. */
export interface StripeErrorBody {
  type: 'invalid_request_error' | 'card_error' | 'api_error' | 'idempotency_error';
  message: string;
  code?: string;
  param?: string;
  decline_code?: string;
  doc_url?: string;
  charge?: string;
  payment_intent?: unknown;
  request_log_url?: string;
}

/**
 * Thrown by handlers and turned into Stripe's error answer by the router. `idempotent` says whether the
 * answer may be saved under an idempotency key: Stripe saves results only once an endpoint has started
 * executing, so parameter validation failures are not saved and a corrected retry with the same key works.
 */
export class StripeHttpError extends Error {
  constructor(
    readonly status: number,
    readonly body: StripeErrorBody,
    readonly idempotent = true,
  ) {
    super(body.message);
  }
}

function docUrl(code: string): string {
  return `https://docs.stripe.com/error-codes/${code.replace(/_/g, '-')}`;
}

export function invalidRequest(
  message: string,
  opts: { param?: string; code?: string; idempotent?: boolean } = {},
) {
  const body: StripeErrorBody = { type: 'invalid_request_error', message };
  if (opts.code) {
    body.code = opts.code;
    body.doc_url = docUrl(opts.code);
  }
  if (opts.param) body.param = opts.param;
  return new StripeHttpError(400, body, opts.idempotent ?? true);
}

/** A parameter problem: never saved under an idempotency key, as Stripe documents. */
export function paramError(message: string, param: string | undefined, code?: string) {
  return invalidRequest(message, { param, code, idempotent: false });
}

export function resourceMissing(objectName: string, id: string, param = 'id', idempotent = true) {
  const body: StripeErrorBody = {
    type: 'invalid_request_error',
    code: 'resource_missing',
    doc_url: docUrl('resource_missing'),
    message: `No such ${objectName}: '${id}'`,
    param,
  };
  return new StripeHttpError(404, body, idempotent);
}

export function unrecognizedUrl(method: string, path: string) {
  return new StripeHttpError(
    404,
    {
      type: 'invalid_request_error',
      message: `Unrecognized request URL (${method}: ${path}). This fake covers only part of the API; see fake-services/stripe/README.md.`,
    },
    false,
  );
}

export function authenticationError(message: string) {
  return new StripeHttpError(401, { type: 'invalid_request_error', message }, false);
}

export function apiError(message = 'An unknown error occurred') {
  return new StripeHttpError(500, { type: 'api_error', message }, false);
}

export function idempotencyError(message: string, status = 400) {
  return new StripeHttpError(status, { type: 'idempotency_error', message }, false);
}

export function cardError(opts: {
  code: string;
  declineCode?: string;
  message: string;
  param?: string;
  charge?: string;
}) {
  const body: StripeErrorBody = {
    type: 'card_error',
    code: opts.code,
    doc_url: docUrl(opts.code),
    message: opts.message,
  };
  if (opts.declineCode) body.decline_code = opts.declineCode;
  if (opts.param) body.param = opts.param;
  if (opts.charge) body.charge = opts.charge;
  return new StripeHttpError(402, body);
}
