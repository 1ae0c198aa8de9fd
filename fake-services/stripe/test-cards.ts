/*
 * Stripe's published test card numbers and what each one does, from Stripe's testing documentation:
 * https://docs.stripe.com/testing (sections "Cards by brand" and "Declined payments").
 * A number that passes the Luhn check but is not listed is declined the way Stripe declines a real
 * card number in test mode; one that fails the check is refused as an incorrect number.
 */

export type CardOutcome =
  { kind: 'success' } | { kind: 'decline'; code: string; declineCode: string | null; message: string };

const GENERIC_DECLINE: CardOutcome = {
  kind: 'decline',
  code: 'card_declined',
  declineCode: 'generic_decline',
  message: 'Your card was declined.',
};

const TEST_CARDS: Record<string, CardOutcome> = {
  '4242424242424242': { kind: 'success' },
  '5555555555554444': { kind: 'success' },
  '4000000000000002': GENERIC_DECLINE,
  '4000000000009995': {
    kind: 'decline',
    code: 'card_declined',
    declineCode: 'insufficient_funds',
    message: 'Your card has insufficient funds.',
  },
  '4000000000000069': {
    kind: 'decline',
    code: 'expired_card',
    declineCode: null,
    message: 'Your card has expired.',
  },
  '4000000000000127': {
    kind: 'decline',
    code: 'incorrect_cvc',
    declineCode: null,
    message: "Your card's security code is incorrect.",
  },
  '4000000000000119': {
    kind: 'decline',
    code: 'processing_error',
    declineCode: null,
    message: 'An error occurred while processing your card. Try again in a little bit.',
  },
};

const LIVE_CARD_IN_TEST_MODE: CardOutcome = {
  kind: 'decline',
  code: 'card_declined',
  declineCode: 'test_mode_live_card',
  message:
    'Your card was declined. Your request was in test mode, but used a non test (live) card. For a list of valid test cards, visit: https://docs.stripe.com/testing.',
};

export function luhnValid(digits: string): boolean {
  if (!/^\d{12,19}$/.test(digits)) return false;
  let sum = 0;
  for (let i = 0; i < digits.length; i += 1) {
    let d = Number(digits[digits.length - 1 - i]);
    if (i % 2 === 1) {
      d *= 2;
      if (d > 9) d -= 9;
    }
    sum += d;
  }
  return sum % 10 === 0;
}

/** What charging this (Luhn-valid) number does. */
export function cardOutcome(digits: string): CardOutcome {
  return TEST_CARDS[digits] ?? LIVE_CARD_IN_TEST_MODE;
}

export function cardBrand(digits: string): string {
  if (digits.startsWith('4')) return 'visa';
  if (/^(5[1-5]|2[2-7])/.test(digits)) return 'mastercard';
  if (/^3[47]/.test(digits)) return 'amex';
  return 'unknown';
}
