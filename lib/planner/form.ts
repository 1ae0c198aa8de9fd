import { minorUnitDigits } from '@/lib/money';

// Turning what a person types into the planner's numbers, and back. Money is typed in the currency's major
// unit ("28.50") and kept as integer minor units; a percentage is kept as basis points. Plain functions, safe
// in the browser.

export type Parsed = { ok: true; value: number } | { ok: false; message: string } | { ok: true; value: undefined };

function decimalParts(text: string): { whole: string; fraction: string; negative: boolean } | null {
  const match = /^(-)?(\d*)(?:[.,](\d*))?$/.exec(text.trim());
  if (!match || (match[2] === '' && (match[3] ?? '') === '')) return null;
  return { negative: match[1] === '-', whole: match[2] || '0', fraction: match[3] ?? '' };
}

/** Exact decimal text to an integer count of 1/10^digits, or a message when it has more decimals than that. */
function scaled(text: string, digits: number, what: string): Parsed {
  if (text.trim() === '') return { ok: true, value: undefined };
  const parts = decimalParts(text);
  if (!parts) return { ok: false, message: `Enter ${what} as a number, like 12.50.` };
  if (parts.fraction.length > digits) {
    return { ok: false, message: digits === 0 ? `Enter ${what} without decimals.` : `Enter ${what} with at most ${digits} decimals.` };
  }
  const value = Number(parts.whole + parts.fraction.padEnd(digits, '0'));
  if (!Number.isSafeInteger(value)) return { ok: false, message: `${what[0]!.toUpperCase()}${what.slice(1)} is too large.` };
  return { ok: true, value: parts.negative ? -value : value };
}

/** "28.50" in EUR → 2850. */
export function moneyTextToMinor(text: string, currency: string, what = 'the amount'): Parsed {
  return scaled(text, minorUnitDigits(currency), what);
}

/** 2850 in EUR → "28.50", as the field's starting text. */
export function minorToMoneyText(minor: number, currency: string): string {
  const digits = minorUnitDigits(currency);
  return (minor / 10 ** digits).toFixed(digits);
}

/** "1.6" (%) → 160 basis points. */
export function percentTextToBasisPoints(text: string, what = 'the percentage'): Parsed {
  return scaled(text, 2, what);
}

export function basisPointsToPercentText(basisPoints: number): string {
  return String(basisPoints / 100);
}
