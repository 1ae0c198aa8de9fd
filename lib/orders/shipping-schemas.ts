import { z } from 'zod';
import { orderNumberSchema } from './schemas';

// Plain rules, safe to import anywhere: the forms and the server read tracking numbers, addresses and notes alike.

export const maxTrackingLength = 40;

// Control characters (Unicode general category Cc: tabs, line breaks, NUL, escape …) most often come along
// when a number is copied out of a carrier's page or a spreadsheet.
const controlCharacter = /\p{Cc}/u;
const controlCharacters = /\p{Cc}/gu;

/** Shows a character a person cannot see or type, by its code: “U+0009”. */
const codeOf = (char: string) => `U+${char.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}`;

/**
 * A tracking number as the studio types or pastes it: trimmed, runs of spaces made one, letters in capitals.
 * Only letters A–Z, digits, spaces and hyphens are taken, which is what the carriers' labels print (common
 * practice, no source), so a pasted character that does not belong is refused with its name, not stored.
 */
export const trackingNumberSchema = z
  .string({ error: 'Enter the tracking number from the parcel’s label.' })
  .superRefine((raw, ctx) => {
    const hidden = raw.match(controlCharacters);
    if (hidden) {
      ctx.addIssue({
        code: 'custom',
        message: `The tracking number has an invisible character in it (${[...new Set(hidden)].map(codeOf).join(', ')}), often from copying. Type the number by hand instead.`,
      });
    }
  })
  .transform((raw) => raw.trim().replace(/ {2,}/g, ' ').toUpperCase())
  .superRefine((value, ctx) => {
    if (controlCharacter.test(value)) return;
    if (value.length === 0) {
      ctx.addIssue({ code: 'custom', message: 'Enter the tracking number from the parcel’s label.' });
      return;
    }
    if (value.length > maxTrackingLength) {
      ctx.addIssue({ code: 'custom', message: `A tracking number here has at most ${maxTrackingLength} characters; check that you copied only the number.` });
      return;
    }
    const wrong = [...new Set(value.replace(/[A-Z0-9 -]/g, ''))];
    if (wrong.length > 0) {
      ctx.addIssue({
        code: 'custom',
        message: `Use only letters A–Z, digits, spaces and hyphens; remove ${wrong.map((char) => `“${char}”`).join(', ')}.`,
      });
      return;
    }
    if (!/^[A-Z0-9]/.test(value)) ctx.addIssue({ code: 'custom', message: 'Start the tracking number with its first letter or digit.' });
  });

export const shipOrderSchema = z.object({
  number: orderNumberSchema,
  carrierId: z.uuid({ error: 'Choose the carrier the parcel goes with.' }),
  trackingNumber: trackingNumberSchema,
});
export type ShipOrderInput = z.input<typeof shipOrderSchema>;

const text = (label: string, max: number) =>
  z
    .string({ error: `Enter the ${label}.` })
    .refine((value) => !controlCharacter.test(value), `The ${label} has an invisible character in it; type it again.`)
    .transform((value) => value.trim().replace(/\s+/g, ' '))
    .pipe(z.string().max(max, `Keep the ${label} under ${max} characters.`));
const required = (label: string, max: number) => text(label, max).pipe(z.string().min(1, `Enter the ${label}.`));
const optional = (label: string, max: number) =>
  z.preprocess((value) => value ?? '', text(label, max)).transform((value) => (value === '' ? null : value));

/** The address a parcel goes to. The country stays the one the shipping was priced for. */
export const shipToSchema = z.object({
  name: required('name on the parcel', 120),
  line1: required('first address line', 120),
  line2: optional('second address line', 120),
  city: required('town or city', 80),
  postal_code: optional('postcode', 20),
  state: optional('county, state or region', 80),
  country: z
    .string({ error: 'country must be a two-letter country code such as IE.' })
    .regex(/^[A-Za-z]{2}$/, 'country must be a two-letter country code such as IE.')
    .transform((value) => value.toUpperCase()),
});
export type ShipToInput = z.output<typeof shipToSchema>;

export const orderNoteSchema = z.object({
  number: orderNumberSchema,
  body: z
    .string({ error: 'Write the note first.' })
    // Line breaks and tabs are part of a note; other control characters are not.
    .refine((value) => !/[^\P{Cc}\n\t\r]/u.test(value), 'The note has an invisible character in it; type it again.')
    .transform((value) => value.replace(/\r\n?/g, '\n').trim())
    .pipe(z.string().min(1, 'Write the note first.').max(2000, 'Keep a note under 2,000 characters; add a second one for more.')),
});

export const emailKinds = ['confirmation', 'shipped'] as const;
export type EmailKind = (typeof emailKinds)[number];
export const emailKindLabels: Record<EmailKind, string> = { confirmation: 'order confirmation', shipped: 'shipped e-mail' };
