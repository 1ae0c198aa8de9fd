'use client';

import { useQuery } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useEffect } from 'react';
import { readApiResponse } from '@/lib/api/client';

/** While a payment is being confirmed, asks every two seconds and reloads the page when the state moves. */
export function PaymentWatch({ number, token, state }: { number: string; token: string | null; state: string }) {
  const router = useRouter();
  const status = useQuery({
    queryKey: ['order-state', number],
    queryFn: async () =>
      readApiResponse<{ state: string }>(await fetch(`/api/orders/${number}${token ? `?token=${encodeURIComponent(token)}` : ''}`, { cache: 'no-store' })),
    refetchInterval: (query) => (query.state.data && query.state.data.state !== state ? false : 2_000),
  });
  const moved = status.data && status.data.state !== state;
  useEffect(() => {
    if (moved) router.refresh();
  }, [moved, router]);
  return (
    <p role="status" aria-live="polite" className="mt-4 rounded-sm border border-paper-edge bg-paper-deep/60 p-4">
      {moved ? 'Payment confirmed. Loading your order…' : 'We are confirming your payment with the card provider. This page updates by itself in a few seconds.'}
    </p>
  );
}
