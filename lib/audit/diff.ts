import { formatMoney } from '@/lib/money';

// Plain functions, safe anywhere: they turn an entry's stored before/after into rows a person reads.

export type DiffRow = { key: string; label: string; before: string; after: string; changed: boolean };

type Flat = Map<string, unknown>;

const isPlainObject = (value: unknown): value is Record<string, unknown> =>
  typeof value === 'object' && value !== null && !Array.isArray(value);

/** One level of nesting is spelled out ("stock › Old Bone"); deeper values are shown as JSON. */
function flatten(value: unknown): Flat {
  const flat: Flat = new Map();
  if (!isPlainObject(value)) {
    if (value !== null && value !== undefined) flat.set('value', value);
    return flat;
  }
  for (const [key, inner] of Object.entries(value)) {
    if (isPlainObject(inner)) for (const [innerKey, leaf] of Object.entries(inner)) flat.set(`${key}.${innerKey}`, leaf);
    else flat.set(key, inner);
  }
  return flat;
}

/** "pullsSoFar" → "Pulls so far", "refundedMinor" → "Refunded"; a nested key keeps its own spelling. */
export function labelFor(key: string): string {
  const [outer = '', inner] = key.split('.', 2);
  const words = outer
    .replace(/Minor$/, '')
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/_/g, ' ')
    .toLowerCase();
  const label = words.charAt(0).toUpperCase() + words.slice(1);
  return inner === undefined ? label : `${label} › ${inner}`;
}

function show(key: string, value: unknown, currency: string | null): string {
  if (value === null || value === undefined) return '—';
  if (typeof value === 'number' && /Minor$/.test(key.split('.')[0] ?? '') && currency && Number.isSafeInteger(value)) {
    return formatMoney({ amountMinor: value, currency });
  }
  if (typeof value === 'number') return value.toLocaleString('en-IE');
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'string') return value;
  if (Array.isArray(value) && value.every((item) => typeof item !== 'object')) return value.join(', ') || '—';
  return JSON.stringify(value);
}

/** Every key of before and after, in the order they first appear, with both sides as text. */
export function diffEntry(before: unknown, after: unknown): DiffRow[] {
  const was = flatten(before);
  const now = flatten(after);
  const currencyOf = (flat: Flat) => (typeof flat.get('currency') === 'string' ? (flat.get('currency') as string) : null);
  const currency = currencyOf(now) ?? currencyOf(was);
  const keys = [...new Set([...was.keys(), ...now.keys()])].filter((key) => key !== 'currency');
  return keys.map((key) => {
    const left = show(key, was.get(key), currency);
    const right = show(key, now.get(key), currency);
    return { key, label: labelFor(key), before: left, after: right, changed: left !== right };
  });
}
