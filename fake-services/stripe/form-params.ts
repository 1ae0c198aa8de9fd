import { paramError } from './stripe-errors';

/**
 * What Stripe's form encoding decodes to: strings at the leaves; `a[b]=` nests; `a[0]=` gives an object
 * keyed by index (turned into an array by the schema, see `indexed` in params.ts); `a[]=` appends.
 */
export type FormValue = string | FormValue[] | FormObject;
export interface FormObject {
  [key: string]: FormValue;
}

const MAX_PAIRS = 2000;
const MAX_DEPTH = 8;
const KEY_SHAPE = /^([^[\]]+)((?:\[[^[\]]*\])*)$/;

/** Null-prototype objects, so a key named `__proto__` or `constructor` is just a key. */
function emptyObject(): FormObject {
  return Object.create(null) as FormObject;
}

function bracketName(segments: string[], upTo: number): string {
  const [head, ...rest] = segments.slice(0, upTo);
  return `${head ?? ''}${rest.map((s) => `[${s}]`).join('')}`;
}

function splitKey(key: string): string[] {
  const match = KEY_SHAPE.exec(key);
  if (!match || match[1] === undefined) throw paramError(`Invalid parameter name: ${key}`, key);
  const segments = [match[1]];
  const brackets = match[2] ?? '';
  for (const part of brackets.matchAll(/\[([^[\]]*)\]/g)) segments.push(part[1] ?? '');
  if (segments.length > MAX_DEPTH) throw paramError(`Parameter nesting too deep: ${key}`, key);
  return segments;
}

function assign(root: FormObject, segments: string[], value: string): void {
  let container: FormObject | FormValue[] = root;
  for (let i = 0; i < segments.length; i += 1) {
    const segment = segments[i] as string;
    const last = i === segments.length - 1;
    const nextIsPush = segments[i + 1] === '';
    if (Array.isArray(container)) {
      if (segment !== '') throw paramError('Invalid array', bracketName(segments, i));
      if (last) {
        container.push(value);
        return;
      }
      const child: FormObject | FormValue[] = nextIsPush ? [] : emptyObject();
      container.push(child);
      container = child;
      continue;
    }
    if (segment === '') throw paramError('Invalid hash', bracketName(segments, i));
    if (last) {
      if (typeof container[segment] === 'object')
        throw paramError('Invalid hash', bracketName(segments, i + 1));
      container[segment] = value;
      return;
    }
    const existing: FormValue | undefined = container[segment];
    if (existing === undefined) {
      const child: FormObject | FormValue[] = nextIsPush ? [] : emptyObject();
      container[segment] = child;
      container = child;
    } else if (typeof existing === 'string' || Array.isArray(existing) !== nextIsPush) {
      throw paramError(nextIsPush ? 'Invalid array' : 'Invalid hash', bracketName(segments, i + 1));
    } else {
      container = existing;
    }
  }
}

/** Decodes a form body or query string the way Stripe reads the SDK's requests. */
export function parseFormParams(encoded: string): FormObject {
  const root = emptyObject();
  const pairs = new URLSearchParams(encoded);
  let count = 0;
  for (const [key, value] of pairs) {
    count += 1;
    if (count > MAX_PAIRS) throw paramError('Too many parameters in one request.', undefined);
    assign(root, splitKey(key), value);
  }
  return root;
}

/** `['line_items', 0, 'quantity']` → `line_items[0][quantity]`, the way Stripe names a param in errors. */
export function paramName(path: ReadonlyArray<PropertyKey>): string {
  const [head, ...rest] = path.map(String);
  return `${head ?? ''}${rest.map((s) => `[${s}]`).join('')}`;
}
