import { domainToASCII } from 'node:url';
import { z } from 'zod';

// What we accept is a deliverable subset of RFC 5322's addr-spec, within RFC 5321's size limits:
// - the local part is a dot-atom (RFC 5322 §3.2.3): atext characters, dots only between them;
//   quoted local parts ("a b"@example.com) are valid there but rarely deliverable, so we refuse them;
// - at most 64 octets before the @ and 254 in all (RFC 5321 §4.5.3.1.1 and .3, less the path's brackets);
// - the domain is a host name of LDH labels of 1–63 octets (RFC 1035 §2.3.1, RFC 5321 §4.1.2) with at
//   least two labels; address literals (user@[192.0.2.1]) are refused;
// - an internationalised domain is accepted and stored in its ASCII (punycode) form; a non-ASCII local
//   part (RFC 6531) is refused with its own message, since not every mail server along the way takes it.
const ATEXT = "A-Za-z0-9!#$%&'*+/=?^_`{|}~-";
const DOT_ATOM = new RegExp(`^[${ATEXT}]+(\\.[${ATEXT}]+)*$`);
const LABEL = /^[a-z0-9]([a-z0-9-]{0,61}[a-z0-9])?$/;

export type EmailProblem = { code: string; message: string };

/** Normalises an address, or says what is wrong with it in words a person can act on. */
export function checkEmailAddress(input: string): { ok: true; email: string } | { ok: false; problem: EmailProblem } {
  const fail = (code: string, message: string) => ({ ok: false as const, problem: { code, message } });
  const value = input.trim();
  if (value.length === 0) return fail('email_missing', 'Enter your e-mail address.');
  const at = value.lastIndexOf('@');
  if (at < 0) return fail('email_no_at', 'An e-mail address needs an @, as in name@example.com.');
  const local = value.slice(0, at);
  const rawDomain = value.slice(at + 1);
  if (local.length === 0) return fail('email_no_local_part', 'Add the part before the @, as in name@example.com.');
  if (rawDomain.length === 0) return fail('email_no_domain', 'Add the part after the @, as in name@example.com.');
  if (local.includes('@') || local.startsWith('"')) {
    return fail('email_unsupported_form', 'Use a plain address such as name@example.com, without quotes or extra @ signs.');
  }
  if (/[^\x00-\x7f]/.test(local)) {
    return fail('email_non_ascii_local_part', 'Use an address whose part before the @ has only Latin letters, digits and . _ - + signs.');
  }
  if (!DOT_ATOM.test(local)) {
    return fail('email_bad_local_part', 'The part before the @ has a space or a character an address cannot have, or a misplaced dot.');
  }
  if (Buffer.byteLength(local) > 64) return fail('email_local_part_too_long', 'The part before the @ is longer than the 64 characters mail servers accept.');
  if (rawDomain.startsWith('[')) return fail('email_address_literal', 'Use an address with a domain name, not an IP address.');

  const domain = domainToASCII(rawDomain.toLowerCase().replace(/\.$/, ''));
  const labels = domain.split('.');
  if (domain === '' || labels.some((label) => !LABEL.test(label))) {
    return fail('email_bad_domain', 'The part after the @ is not a domain name: check for spaces, underscores or double dots.');
  }
  if (labels.length < 2) return fail('email_bad_domain', 'The part after the @ needs a full domain, as in example.com.');
  if (/^[0-9]+$/.test(labels[labels.length - 1]!)) return fail('email_bad_domain', 'The part after the @ must end in a name, not a number.');

  // Common practice: treat the whole address as case-insensitive, as nearly every mail provider does,
  // even though RFC 5321 lets a server tell upper from lower case in the local part.
  const email = `${local.toLowerCase()}@${domain}`;
  if (email.length > 254) return fail('email_too_long', 'That address is longer than the 254 characters mail servers accept.');
  return { ok: true, email };
}

/** The same check as a zod schema for forms and handlers; the output is the normalised address. */
export const emailAddressSchema = z.string({ error: 'Enter your e-mail address.' }).max(1000, 'That is far too long for an e-mail address.').transform((value, ctx) => {
  const result = checkEmailAddress(value);
  if (result.ok) return result.email;
  ctx.addIssue({ code: 'custom', message: result.problem.message, params: { reason: result.problem.code } });
  return z.NEVER;
});
