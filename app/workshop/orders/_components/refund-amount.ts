// An amount typed by a person ("240", "240.50", "240,50") to the currency's minor units. Plain code:
// the refund form checks with it before its confirm step, and the server action decides with it.
import { minorUnitDigits } from '@/lib/money';

export type ParsedAmount = { ok: true; amountMinor: number } | { ok: false; message: string };

const example = (digits: number) => (digits === 0 ? '240' : `240.${'5'.padEnd(digits, '0')}`);

export function parseAmount(text: string, currency: string): ParsedAmount {
  const value = text.trim();
  if (value === '') return { ok: false, message: 'Enter the amount to refund.' };
  const digits = minorUnitDigits(currency);
  const match = /^(\d{1,9})(?:[.,](\d+))?$/.exec(value);
  if (!match) return { ok: false, message: `Enter the amount as a number, such as ${example(digits)}.` };
  const fraction = match[2] ?? '';
  if (fraction.length > digits) {
    return {
      ok: false,
      message:
        digits === 0
          ? `${currency} has no decimals: enter a whole amount, such as ${example(digits)}.`
          : `${currency} has ${digits} decimal${digits === 1 ? '' : 's'} at most, such as ${example(digits)}.`,
    };
  }
  const amountMinor = Number(match[1]) * 10 ** digits + Number(fraction.padEnd(digits, '0') || '0');
  if (amountMinor <= 0) return { ok: false, message: 'The amount must be more than zero.' };
  return { ok: true, amountMinor };
}
