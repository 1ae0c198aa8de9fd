import { z } from 'zod';
import { paramName } from './form-params';
import { paramError, StripeHttpError } from './stripe-errors';

/*
 * Zod pieces for form-encoded Stripe parameters. Every leaf arrives as a string, so numbers and booleans
 * are parsed here, and the problems are reported with Stripe's codes (parameter_missing,
 * parameter_unknown, parameter_invalid_integer, ...) and its bracketed param names.
 */

type StripeCode =
  | 'parameter_invalid_integer'
  | 'parameter_invalid_empty'
  | 'parameter_invalid_string'
  | 'parameter_invalid_boolean';

function fail(ctx: z.RefinementCtx, message: string, stripeCode: StripeCode): never {
  ctx.addIssue({ code: 'custom', message, params: { stripeCode } });
  return z.NEVER as never;
}

/** A required string; Stripe treats an empty value as "not given". */
export const text = (max = 5000) =>
  z.string().transform((value, ctx) => {
    if (value === '')
      return fail(ctx, 'You passed an empty string, but this value must be set.', 'parameter_invalid_empty');
    if (value.length > max)
      return fail(ctx, `This value must be at most ${max} characters.`, 'parameter_invalid_string');
    return value;
  });

/** An optional string: absent and empty both mean "not given". */
export const optionalText = (max = 5000) =>
  z
    .string()
    .optional()
    .transform((value, ctx) => {
      if (value === undefined || value === '') return undefined;
      if (value.length > max)
        return fail(ctx, `This value must be at most ${max} characters.`, 'parameter_invalid_string');
      return value;
    });

export const integer = (min: number, max = Number.MAX_SAFE_INTEGER) =>
  z.string().transform((value, ctx) => {
    if (!/^-?\d+$/.test(value)) return fail(ctx, `Invalid integer: ${value}`, 'parameter_invalid_integer');
    const n = Number(value);
    if (n < min)
      return fail(ctx, `This value must be greater than or equal to ${min}.`, 'parameter_invalid_integer');
    if (n > max)
      return fail(ctx, `This value must be less than or equal to ${max}.`, 'parameter_invalid_integer');
    return n;
  });

export const optionalInteger = (min: number, max = Number.MAX_SAFE_INTEGER) =>
  z
    .string()
    .optional()
    .transform((value, ctx) => {
      if (value === undefined || value === '') return undefined;
      const parsed = integer(min, max).safeParse(value);
      if (!parsed.success)
        return fail(ctx, parsed.error.issues[0]?.message ?? 'Invalid integer', 'parameter_invalid_integer');
      return parsed.data;
    });

export const optionalBoolean = () =>
  z
    .string()
    .optional()
    .transform((value, ctx) => {
      if (value === undefined || value === '') return undefined;
      if (value === 'true') return true;
      if (value === 'false') return false;
      return fail(ctx, `Invalid boolean: ${value}`, 'parameter_invalid_boolean');
    });

/** One of a fixed set, with Stripe's "Invalid x: must be one of ..." wording. */
export const oneOf = <const T extends readonly [string, ...string[]]>(values: T) =>
  z.string().transform((value, ctx): T[number] => {
    if ((values as readonly string[]).includes(value)) return value as T[number];
    return fail(ctx, `Invalid value: must be one of ${values.join(', ')}`, 'parameter_invalid_string');
  });

export const currency = () =>
  z.string().transform((value, ctx) => {
    if (!/^[a-zA-Z]{3}$/.test(value))
      return fail(ctx, `Invalid currency: ${value}.`, 'parameter_invalid_string');
    return value.toLowerCase();
  });

/** Arrays arrive as `a[0]=..&a[1]=..` (an object keyed by index, as the SDK sends) or `a[]=..` (an array). */
export function indexed<T extends z.ZodType>(item: T, opts: { min?: number; max?: number } = {}) {
  const list = z
    .array(item)
    .min(opts.min ?? 0)
    .max(opts.max ?? 1000);
  return z.preprocess((value) => {
    if (Array.isArray(value) || value === null || typeof value !== 'object') return value;
    const entries = Object.entries(value as Record<string, unknown>);
    if (!entries.every(([key]) => /^\d+$/.test(key))) return value;
    return entries.sort(([a], [b]) => Number(a) - Number(b)).map(([, v]) => v);
  }, list);
}

/**
 * Stripe's metadata limits: 50 keys, key ≤ 40 characters, value ≤ 500. An empty value unsets the key,
 * which on a create simply leaves it out.
 */
export const metadata = () =>
  z
    .record(z.string(), z.string())
    .optional()
    .transform((value, ctx) => {
      const out: Record<string, string> = {};
      if (!value) return out;
      for (const [key, v] of Object.entries(value)) {
        if (key.length > 40)
          return fail(ctx, `Metadata keys can be at most 40 characters: ${key}`, 'parameter_invalid_string');
        if (v.length > 500)
          return fail(
            ctx,
            `Metadata values can be at most 500 characters (key ${key}).`,
            'parameter_invalid_string',
          );
        if (v !== '') out[key] = v;
      }
      if (Object.keys(out).length > 50)
        return fail(ctx, 'You can have at most 50 metadata keys.', 'parameter_invalid_string');
      return out;
    });

export const expandParam = () => indexed(z.string(), { max: 20 }).optional();

function valueAt(root: unknown, path: ReadonlyArray<PropertyKey>): unknown {
  let node = root;
  for (const key of path) {
    if (node === null || typeof node !== 'object') return undefined;
    node = (node as Record<PropertyKey, unknown>)[key];
  }
  return node;
}

/** Turns the first zod problem into the error Stripe would give for it. */
export function toStripeError(issues: ReadonlyArray<z.core.$ZodIssue>, input: unknown): StripeHttpError {
  const issue = issues[0];
  if (!issue) return paramError('Invalid request.', undefined);
  if (issue.code === 'unrecognized_keys') {
    const name = paramName([...issue.path, issue.keys[0] ?? '']);
    return paramError(`Received unknown parameter: ${name}`, name, 'parameter_unknown');
  }
  const name = issue.path.length ? paramName(issue.path) : undefined;
  if (issue.code === 'invalid_type' && valueAt(input, issue.path) === undefined) {
    return paramError(`Missing required param: ${name}.`, name, 'parameter_missing');
  }
  if (issue.code === 'invalid_type') {
    const wanted =
      issue.expected === 'array'
        ? 'Invalid array'
        : issue.expected === 'object' || issue.expected === 'record'
          ? 'Invalid hash'
          : `Invalid ${issue.expected}`;
    return paramError(wanted, name);
  }
  if (issue.code === 'custom') {
    const stripeCode = (issue.params as { stripeCode?: string } | undefined)?.stripeCode;
    return paramError(issue.message, name, stripeCode);
  }
  if (issue.code === 'too_big' || issue.code === 'too_small') {
    return paramError(issue.message, name, 'parameter_invalid_integer');
  }
  return paramError(issue.message, name);
}

/** Parses with a schema or throws Stripe's 400 for the first problem. */
export function parseParams<T extends z.ZodType>(schema: T, input: unknown): z.output<T> {
  const parsed = schema.safeParse(input);
  if (!parsed.success) throw toStripeError(parsed.error.issues, input);
  return parsed.data;
}
