'use client';

import { useMutation, useQuery } from '@tanstack/react-query';
import { useId, useState } from 'react';
import { Price } from '@/components/ui/price';
import { ApiError, readApiResponse } from '@/lib/api/client';
import type { CheckoutOptions } from '@/lib/orders/checkout';

const percent = (bp: number) => `${(bp / 100).toLocaleString('en', { maximumFractionDigits: 2 })}%`;

async function fetchOptions(holdId: string, country: string | null): Promise<CheckoutOptions> {
  const query = new URLSearchParams({ holdId, ...(country ? { country } : {}) });
  return readApiResponse<CheckoutOptions>(await fetch(`/api/checkout/options?${query}`, { cache: 'no-store' }));
}

/** Where to ship and how, with the total from the server, then off to the payment page. */
export function CheckoutForm({ holdId, defaultCountry }: { holdId: string; defaultCountry: string }) {
  const [chosenCountry, setCountry] = useState<string | null>(null);
  const [chosenRate, setRate] = useState<string | null>(null);
  const countryId = useId();
  const noteId = useId();
  const [note, setNote] = useState('');
  const base = useQuery({ queryKey: ['checkout', holdId], queryFn: () => fetchOptions(holdId, null), staleTime: 60_000 });
  const countries = base.data?.countries ?? [];
  const country = chosenCountry ?? (countries.some((c) => c.code === defaultCountry) ? defaultCountry : (countries[0]?.code ?? null));
  const priced = useQuery({
    queryKey: ['checkout', holdId, country],
    queryFn: () => fetchOptions(holdId, country),
    enabled: Boolean(country),
    staleTime: 60_000,
  });
  const options = priced.data?.options ?? [];
  const option = options.find((o) => o.rateId === chosenRate) ?? options[0] ?? null;
  const pay = useMutation({
    mutationFn: async () =>
      readApiResponse<{ url: string; orderNumber: string }>(
        await fetch('/api/checkout', {
          method: 'POST',
          headers: { 'Content-Type': 'application/json' },
          body: JSON.stringify({ holdId, country, shippingRateId: option?.rateId, note: note.trim() || undefined }),
        }),
      ),
    onSuccess: ({ url }) => window.location.assign(url),
  });
  const loadError = base.error ?? priced.error;
  const error = pay.error ?? null;

  if (base.isPending) return <p className="mt-3 text-sm text-ink-soft">Working out shipping…</p>;
  if (loadError && !base.data) {
    return (
      <p role="alert" className="mt-3 text-sm font-semibold text-ember-deep">
        {loadError instanceof ApiError ? loadError.message : 'Shipping could not be loaded. Check your connection and try again.'}
      </p>
    );
  }
  return (
    <form
      className="mt-4 grid gap-4"
      onSubmit={(event) => {
        event.preventDefault();
        if (option && !pay.isPending) pay.mutate();
      }}
    >
      <div className="grid gap-1">
        <label htmlFor={countryId} className="text-sm font-semibold">
          Ship to
        </label>
        <select
          id={countryId}
          value={country ?? ''}
          onChange={(event) => {
            setCountry(event.target.value);
            setRate(null);
          }}
          className="max-w-xs rounded-sm border border-paper-edge bg-white px-3 py-2"
        >
          {countries.map((c) => (
            <option key={c.code} value={c.code}>
              {c.name}
            </option>
          ))}
        </select>
      </div>
      <fieldset className="grid gap-2">
        <legend className="text-sm font-semibold">Shipping</legend>
        {priced.isPending ? <p className="text-sm text-ink-soft">Pricing shipping…</p> : null}
        {!priced.isPending && options.length === 0 ? (
          <p className="text-sm text-ember-deep">The studio has no way to ship this parcel to {countries.find((c) => c.code === country)?.name ?? 'that country'}.</p>
        ) : null}
        {options.map((o) => (
          <label key={o.rateId} className="flex cursor-pointer items-center gap-3 rounded-sm border border-paper-edge bg-white px-3 py-2 has-[:checked]:border-ink">
            <input type="radio" name="shipping" value={o.rateId} checked={option?.rateId === o.rateId} onChange={() => setRate(o.rateId)} />
            <span className="flex-1">
              {o.label}
              <span className="block text-sm text-ink-soft">
                {o.minDays === o.maxDays ? `${o.minDays} working day${o.minDays === 1 ? '' : 's'}` : `${o.minDays}–${o.maxDays} working days`} after dispatch
              </span>
            </span>
            <Price value={{ amountMinor: o.amountMinor, currency: priced.data!.currency }} />
          </label>
        ))}
      </fieldset>
      <div className="grid max-w-md gap-1">
        <label htmlFor={noteId} className="text-sm font-semibold">
          Note for the studio <span className="font-normal text-ink-soft">(optional)</span>
        </label>
        <textarea
          id={noteId}
          value={note}
          onChange={(event) => setNote(event.target.value)}
          maxLength={500}
          rows={2}
          aria-describedby={`${noteId}-hint`}
          className="rounded-sm border border-paper-edge bg-white px-3 py-2"
        />
        <p id={`${noteId}-hint`} className="text-xs text-ink-soft">
          A gift, a door code, a name for the packing slip. The studio reads it when it packs your parcel.
        </p>
      </div>
      {option && priced.data ? (
        <dl className="grid max-w-sm grid-cols-[1fr_auto] gap-x-6 gap-y-1 text-sm">
          <dt>Mask{priced.data.linesMinor > 0 ? '' : 's'}</dt>
          <dd className="text-right"><Price value={{ amountMinor: priced.data.linesMinor, currency: priced.data.currency }} /></dd>
          <dt>Shipping</dt>
          <dd className="text-right"><Price value={{ amountMinor: option.amountMinor, currency: priced.data.currency }} /></dd>
          <dt className="text-base font-semibold">Total</dt>
          <dd className="text-right text-base font-semibold" data-testid="checkout-total">
            <Price value={{ amountMinor: option.totalMinor, currency: priced.data.currency }} />
          </dd>
          <dt className="text-ink-soft">Includes {priced.data.taxLabel} at {percent(priced.data.taxRateBasisPoints)}</dt>
          <dd className="text-right text-ink-soft"><Price value={{ amountMinor: option.taxIncludedMinor, currency: priced.data.currency }} /></dd>
        </dl>
      ) : null}
      <div className="flex flex-wrap items-center gap-3">
        <button
          type="submit"
          disabled={!option || pay.isPending || pay.isSuccess}
          className="rounded-full bg-ink px-6 py-2.5 font-semibold text-paper hover:bg-ink-soft disabled:cursor-not-allowed disabled:opacity-60"
        >
          {pay.isPending || pay.isSuccess ? 'Opening the payment page…' : option && priced.data ? <>Pay <Price value={{ amountMinor: option.totalMinor, currency: priced.data.currency }} /></> : 'Pay'}
        </button>
        <p className="text-sm text-ink-soft">You pay by card on a secure payment page, then come back here.</p>
      </div>
      {error ? (
        <p role="alert" className="text-sm font-semibold text-ember-deep">
          {error instanceof ApiError ? error.message : 'We could not reach the shop. Your hold is still yours: try again.'}
        </p>
      ) : null}
    </form>
  );
}
