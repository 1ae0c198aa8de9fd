'use server';

import { revalidatePath } from 'next/cache';
import { z } from 'zod';
import { AppError } from '@/lib/api/errors';
import { authorizedAction } from '@/lib/auth/action';
import { kickMail } from '@/lib/mail/outbox';
import { formatMoney } from '@/lib/money';
import { advanceOrders, maxOrdersPerAdvance } from '@/lib/orders/bulk-advance';
import { getOrderByNumber } from '@/lib/orders/queries';
import { confirmExtraCast, refundOrder } from '@/lib/orders/refunds';
import { addOrderNote, resendOrderEmail, shipOrder, updateShipTo } from '@/lib/orders/shipping-actions';
import { emailKinds, orderNoteSchema, shipOrderSchema, shipToSchema } from '@/lib/orders/shipping-schemas';
import {
  lineIdSchema,
  orderNumberSchema,
  refundReasons,
  refundSchema,
  type RefundInput,
} from '@/lib/orders/schemas';
import { parseAmount } from './_components/refund-amount';

// The form arrives through Object.fromEntries, so the chosen masks come as one comma-separated field
// and a checkbox as "on" or not at all.
const lineIdList = z
  .string()
  .optional()
  .transform((value) =>
    (value ?? '')
      .split(',')
      .map((id) => id.trim())
      .filter(Boolean),
  )
  .pipe(
    z
      .array(z.uuid({ error: 'That is not a mask of this order.' }))
      .max(10, 'Refund at most 10 masks at a time.'),
  );

const checkbox = z
  .string()
  .optional()
  .transform((value) => value === 'on' || value === 'true');

const refundFormSchema = z
  .object({
    number: orderNumberSchema,
    currency: z.string({ error: 'That is not a currency.' }).regex(/^[A-Z]{3}$/, 'That is not a currency.'),
    mode: z.enum(['all', 'lines', 'amount'], {
      error: 'Choose what to refund: the whole order, some masks, or an amount.',
    }),
    lineIds: lineIdList,
    amount: z.string().max(20, 'Enter the amount as a number, such as 240.50.').optional(),
    reason: z.enum(refundReasons, { error: 'Choose a reason for the refund.' }),
    note: z.string().trim().max(500, 'Keep the note under 500 characters.').optional().default(''),
    restock: checkbox,
  })
  .transform((form, ctx) => {
    if (form.mode === 'lines' && form.lineIds.length === 0) {
      ctx.addIssue({ code: 'custom', path: ['lineIds'], message: 'Choose at least one mask to refund.' });
      return z.NEVER;
    }
    let amountMinor: number | null = null;
    if (form.mode === 'amount') {
      const parsed = parseAmount(form.amount ?? '', form.currency);
      if (!parsed.ok) {
        ctx.addIssue({ code: 'custom', path: ['amount'], message: parsed.message });
        return z.NEVER;
      }
      amountMinor = parsed.amountMinor;
    }
    return { ...form, amountMinor };
  });

const extraCastFormSchema = lineIdSchema.extend({ number: orderNumberSchema });

function revalidateOrder(number: string) {
  revalidatePath('/workshop/orders');
  revalidatePath('/workshop/oversold');
  revalidatePath(`/workshop/orders/${number}`);
}

export const refundOrderAction = authorizedAction('owner', refundFormSchema, async (form, user) => {
  const order = await getOrderByNumber(form.number);
  if (!order) throw new AppError('order_not_found', 'There is no such order.', 404);
  // The amount was read in the form's currency: it must be the order's.
  if (order.currency !== form.currency) {
    throw new AppError(
      'currency_changed',
      'This form does not match the order any more. Reload the order and try again.',
      409,
    );
  }
  const base = { orderId: order.id, reason: form.reason, note: form.note, restock: form.restock };
  const candidate =
    form.mode === 'all'
      ? { mode: 'all' as const, ...base }
      : form.mode === 'lines'
        ? { mode: 'lines' as const, ...base, lineIds: form.lineIds }
        : // An amount gives no masks back, so none go back on sale.
          { mode: 'amount' as const, ...base, restock: false, amountMinor: form.amountMinor };
  const checked = refundSchema.safeParse(candidate);
  if (!checked.success) {
    throw new AppError(
      'invalid_input',
      checked.error.issues[0]?.message ?? 'Please check the refund and try again.',
      422,
    );
  }
  const input: RefundInput = checked.data;

  let result: Awaited<ReturnType<typeof refundOrder>>;
  try {
    result = await refundOrder(user, input);
  } catch (error) {
    // The domain counts in minor units; the maker reads money.
    if (
      error instanceof AppError &&
      error.code === 'amount_too_large' &&
      typeof error.details?.leftMinor === 'number'
    ) {
      const left = formatMoney({ amountMinor: error.details.leftMinor, currency: order.currency });
      throw new AppError(
        error.code,
        `At most ${left} is left to refund on this order.`,
        error.status,
        error.details,
      );
    }
    throw error;
  } finally {
    revalidateOrder(order.number);
  }

  const amount = formatMoney({ amountMinor: result.amountMinor, currency: order.currency });
  if (result.status === 'succeeded') return `Refunded ${amount}. The buyer gets an e-mail.`;
  if (result.status === 'failed') {
    throw new AppError(
      'refund_failed',
      `The payment service could not refund ${amount}. The order shows it as failed; you can try again.`,
      502,
    );
  }
  return `Refund of ${amount} recorded. ${result.message}`;
});

export const confirmExtraCastAction = authorizedAction('owner', extraCastFormSchema, async (input, user) => {
  await confirmExtraCast(user, input.lineId);
  revalidateOrder(input.number);
  return 'An extra will be cast: the batch grows by one and this mask counts as sold.';
});

// Shipping, the address, notes and e-mails: the studio hands' work as much as the owner's.

export const shipOrderAction = authorizedAction('staff', shipOrderSchema, async (input, user) => {
  try {
    const result = await shipOrder(user, input);
    kickMail();
    return result.message;
  } finally {
    revalidateOrder(input.number);
  }
});

const shipToFormSchema = shipToSchema.extend({ number: orderNumberSchema });

export const updateShipToAction = authorizedAction('staff', shipToFormSchema, async ({ number, ...shipTo }, user) => {
  const message = await updateShipTo(user, { number, shipTo });
  revalidateOrder(number);
  return message;
});

export const addOrderNoteAction = authorizedAction('staff', orderNoteSchema, async (input, user) => {
  const message = await addOrderNote(user, input);
  revalidatePath(`/workshop/orders/${input.number}`);
  return message;
});

const resendFormSchema = z.object({
  number: orderNumberSchema,
  kind: z.enum(emailKinds, { error: 'Choose which e-mail to send again.' }),
});

export const resendOrderEmailAction = authorizedAction('staff', resendFormSchema, async (input, user) => {
  const message = await resendOrderEmail(user, input);
  kickMail();
  revalidatePath(`/workshop/orders/${input.number}`);
  return message;
});

const advanceFormSchema = z.object({
  orderIds: z
    .string({ error: 'Choose at least one order.' })
    .transform((value) =>
      value
        .split(',')
        .map((id) => id.trim())
        .filter(Boolean),
    )
    .pipe(
      z
        .array(z.uuid({ error: 'That is not an order of the list.' }))
        .min(1, 'Choose at least one order.')
        .max(maxOrdersPerAdvance, `Advance at most ${maxOrdersPerAdvance} orders at a time.`),
    ),
});

export const advanceOrdersAction = authorizedAction('staff', advanceFormSchema, async (input, user) => {
  const summary = await advanceOrders(user, input.orderIds);
  revalidatePath('/workshop/orders');
  revalidatePath('/workshop/production');
  if (summary.moved > 0) kickMail();
  // Nothing moved is an answer the person must read, not a success.
  if (summary.moved === 0) throw new AppError('nothing_moved', summary.message, 409, { fields: { orderIds: summary.refused } });
  return summary.message;
});
