import Stripe from 'stripe';
import { AppError, errorResponse } from '@/lib/api/errors';
import { apiHandler, noStore } from '@/lib/api/handler';
import { getEnv } from '@/lib/env';
import { kickMail } from '@/lib/mail/outbox';
import { handleStripeEvent } from '@/lib/orders/payments';

// Stripe's events are small; anything much larger is not from Stripe.
const maxBodyBytes = 512 * 1024;

/**
 * Stripe's webhook: the raw body is verified with the SDK's own constructEvent (default tolerance of
 * five minutes) before anything is read from it; each event id is recorded once and applied in one
 * transaction. A failure to apply answers 503, so Stripe delivers the event again later.
 */
export const POST = apiHandler(async (request: Request) => {
  const secret = getEnv().STRIPE_WEBHOOK_SECRET;
  if (!secret) throw new AppError('webhooks_not_configured', 'This shop has no webhook secret set (STRIPE_WEBHOOK_SECRET).', 503, undefined, 300);
  const signature = request.headers.get('stripe-signature');
  if (!signature) throw new AppError('signature_missing', 'A Stripe-Signature header is required.', 400);
  const declared = Number(request.headers.get('content-length') ?? 0);
  if (declared > maxBodyBytes) throw new AppError('body_too_large', 'The event is larger than any Stripe event.', 413);
  const body = await request.text();
  if (Buffer.byteLength(body) > maxBodyBytes) throw new AppError('body_too_large', 'The event is larger than any Stripe event.', 413);

  let event: Stripe.Event;
  try {
    // Verification needs no network and no API key: the static helper is enough.
    event = Stripe.webhooks.constructEvent(body, signature, secret);
  } catch (error) {
    const message = error instanceof Error ? error.message : 'the signature does not match';
    return errorResponse(new AppError('signature_invalid', `The Stripe signature is not valid: ${message.split('\n')[0]}`, 400));
  }
  let result;
  try {
    result = await handleStripeEvent(event);
  } catch (error) {
    console.error('Applying a Stripe event failed; Stripe will deliver it again', { id: event.id, type: event.type, error });
    throw new AppError('event_not_applied', 'The event could not be applied just now; deliver it again later.', 503, undefined, 30);
  }
  kickMail();
  return Response.json({ received: true, ...result }, { headers: noStore });
});
