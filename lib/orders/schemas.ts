import { z } from 'zod';

const country = z
  .string({ error: 'country must be a two-letter country code such as IE.' })
  .regex(/^[A-Za-z]{2}$/, 'country must be a two-letter country code such as IE.')
  .transform((value) => value.toUpperCase());

export const checkoutSchema = z.object({
  holdId: z.uuid({ error: 'holdId must be the id of one of your holds.' }),
  country,
  shippingRateId: z.uuid({ error: 'Choose one of the shipping options shown.' }),
  // A line for the studio (a gift, a door code). Line breaks are fine; other control characters are not text.
  note: z
    .string({ error: 'The note must be text.' })
    .trim()
    .max(500, 'Keep the note for the studio under 500 characters.')
    .refine((value) => !/[\u0000-\u0009\u000B\u000C\u000E-\u001F\u007F]/.test(value), 'The note has a character that is not text: please type it again.')
    .optional()
    .transform((value) => (value ? value : null)),
});
export type CheckoutInput = Omit<z.infer<typeof checkoutSchema>, 'note'> & { note?: string | null };

export const checkoutOptionsSchema = z.object({
  holdId: z.uuid({ error: 'holdId must be the id of one of your holds.' }),
  country: country.optional(),
});

export const orderNumberSchema = z.string().regex(/^DM-\d{4,12}$/, 'That is not an order number (they look like DM-1001).');

export const refundReasons = ['oversold', 'failed_casting', 'buyer_request', 'other'] as const;
export type RefundReason = (typeof refundReasons)[number] | 'duplicate_payment';
export const refundReasonLabels: Record<RefundReason, string> = {
  oversold: 'Paid after the stock had gone',
  failed_casting: 'A casting failed',
  buyer_request: "Buyer's request",
  duplicate_payment: 'Paid twice',
  other: 'Other',
};

const refundBase = {
  orderId: z.uuid({ error: 'That is not an order.' }),
  reason: z.enum(refundReasons, { error: 'Choose a reason for the refund.' }),
  note: z.string().trim().max(500, 'Keep the note under 500 characters.').default(''),
  restock: z.boolean().default(false),
};

export const refundSchema = z.discriminatedUnion(
  'mode',
  [
    z.object({ mode: z.literal('all'), ...refundBase }),
    z.object({
      mode: z.literal('lines'),
      ...refundBase,
      lineIds: z.array(z.uuid({ error: 'That is not a line of this order.' })).min(1, 'Choose at least one mask to refund.').max(10),
    }),
    z.object({
      mode: z.literal('amount'),
      ...refundBase,
      amountMinor: z
        .number({ error: 'Enter the amount to refund.' })
        .int('Enter the amount in whole cents.')
        .positive('The amount must be more than zero.')
        .max(100_000_000, 'That is more than any order.'),
    }),
  ],
  { error: 'Choose what to refund: the whole order, some masks, or an amount.' },
);
export type RefundInput = z.infer<typeof refundSchema>;

export const lineIdSchema = z.object({ lineId: z.uuid({ error: 'That is not an order line.' }) });
