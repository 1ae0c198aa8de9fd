import { describe, expect, it } from 'vitest';
import { checkEmailAddress, emailAddressSchema } from '@/lib/auth/email-address';

// Cases from the RFCs' own grammar and limits; where we refuse something the RFC allows, the test says so.
describe('e-mail addresses', () => {
  it.each([
    // RFC 5322 §3.4.1 addr-spec with a dot-atom local part (§3.2.3 atext includes these symbols).
    ['simple@example.com', 'simple@example.com'],
    ['very.common@example.com', 'very.common@example.com'],
    ['disposable.style.email.with+symbol@example.com', 'disposable.style.email.with+symbol@example.com'],
    ["o'hara!#$%&*=?^_`{|}~-@example.org", "o'hara!#$%&*=?^_`{|}~-@example.org"],
    ['x@example.com', 'x@example.com'],
    // RFC 1035 §2.3.1: labels may hold digits and inner hyphens.
    ['user@mail-1.example-2.co.uk', 'user@mail-1.example-2.co.uk'],
    // Case-insensitive by common practice (RFC 5321 §2.4 leaves the local part's case to the server).
    ['  Juno.Pell@Example.COM ', 'juno.pell@example.com'],
    // RFC 5890 (IDNA): an internationalised domain, stored as its A-label.
    ['buyer@bücher.example', 'buyer@xn--bcher-kva.example'],
  ])('accepts %s as %s', (input, normalised) => {
    expect(checkEmailAddress(input)).toEqual({ ok: true, email: normalised });
  });

  it.each([
    ['Abc.example.com', 'email_no_at'], // no @ at all
    ['A@b@c@example.com', 'email_unsupported_form'], // only one @ outside quotes (RFC 5322 §3.4.1)
    ['a"b(c)d,e:f;g<h>i[j\\k]l@example.com', 'email_bad_local_part'], // specials outside quotes
    ['just"not"right@example.com', 'email_bad_local_part'],
    ['this is"not\\allowed@example.com', 'email_bad_local_part'],
    ['john..doe@example.com', 'email_bad_local_part'], // dot-atom: no empty atoms
    ['.john@example.com', 'email_bad_local_part'],
    ['i.like.underscores@but_they_are_not_allowed_in_this_part.com', 'email_bad_domain'], // LDH rule
    ['user@-example.com', 'email_bad_domain'], // a label cannot start with a hyphen
    ['user@localhost', 'email_bad_domain'], // valid per RFC 5321 inside a network, refused for the shop
    ['user@[192.0.2.1]', 'email_address_literal'], // RFC 5321 §4.1.3 address literal: valid, refused
    ['"john..doe"@example.org', 'email_unsupported_form'], // RFC 5322 quoted-string: valid, refused
    ['用户@例子.广告', 'email_non_ascii_local_part'], // RFC 6531 (SMTPUTF8) local part: refused
    [`${'a'.repeat(65)}@example.com`, 'email_local_part_too_long'], // RFC 5321 §4.5.3.1.1: 64 octets
    [`a@${'b'.repeat(64)}.com`, 'email_bad_domain'], // RFC 1035 §2.3.4: labels of 63 octets at most
    [`${'a'.repeat(64)}@${'b'.repeat(63)}.${'c'.repeat(63)}.${'d'.repeat(63)}.com`, 'email_too_long'], // 254 in all
    ['user@example.123', 'email_bad_domain'],
    ['', 'email_missing'],
  ])('refuses %s (%s) with a message a person can act on', (input, code) => {
    const result = checkEmailAddress(input);
    expect(result.ok).toBe(false);
    if (!result.ok) {
      expect(result.problem.code).toBe(code);
      expect(result.problem.message.length).toBeGreaterThan(15);
    }
  });

  it('gives forms the same rule and message through zod', () => {
    expect(emailAddressSchema.parse('Kit@Marrowgate.example')).toBe('kit@marrowgate.example');
    const failed = emailAddressSchema.safeParse('kit@marrowgate');
    expect(failed.success).toBe(false);
    expect(failed.error?.issues[0]?.message).toMatch(/full domain/);
    expect(emailAddressSchema.safeParse(42).success).toBe(false);
  });
});
