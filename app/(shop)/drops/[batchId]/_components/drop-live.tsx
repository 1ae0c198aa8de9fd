'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import Image from 'next/image';
import Link from 'next/link';
import { useId, useState, type ReactNode } from 'react';
import { Price } from '@/components/ui/price';
import { ApiError, readApiResponse } from '@/lib/api/client';
import type { DropView } from '@/lib/drops/catalogue';
import { dropPhase, formatCountdown, formatInZone, type DropPhase } from '@/lib/drops/phase';
import { useClock, useOwnTimeZone } from '@/lib/hooks/use-clock';
import { CheckoutForm } from './checkout-form';

type Availability = {
  /** How far the server's clock is ahead of this device's, measured when the answer arrived. */
  offsetMs: number;
  now: string; phase: DropPhase; earlyAccessAt: string | null; opensAt: string; closesAt: string;
  stock: { finishId: string; quantity: number; available: number; held: number; sold: number }[];
};
type MyHold = { id: string; batchId: string; finishId: string; quantity: number; expiresAt: string; finishName: string };

const phaseWords: Record<DropPhase, string> = {
  upcoming: 'Opens soon',
  early_access: 'Early access for the waitlist',
  open: 'Open now',
  sold_out: 'Sold out',
  closed: 'Closed',
  cancelled: 'Cancelled',
};

export function DropLive({
  drop,
  signedIn,
  earlyAccess = false,
  returnedFromCheckout = false,
  waitlistForm = null,
}: {
  drop: DropView;
  signedIn: boolean;
  /** Whether this buyer was invited from the waitlist and may hold before the drop opens to everyone. */
  earlyAccess?: boolean;
  returnedFromCheckout?: boolean;
  waitlistForm?: ReactNode;
}) {
  const queryClient = useQueryClient();
  const availability = useQuery({
    queryKey: ['availability', drop.id],
    queryFn: async () => {
      const data = await readApiResponse<Omit<Availability, 'offsetMs'>>(await fetch(`/api/drops/${drop.id}/availability`, { cache: 'no-store' }));
      return { ...data, offsetMs: new Date(data.now).getTime() - Date.now() };
    },
    refetchInterval: 2_000,
  });
  const mine = useQuery({
    queryKey: ['holds', 'mine'],
    enabled: signedIn,
    queryFn: async () => (await readApiResponse<{ holds: MyHold[] }>(await fetch('/api/holds/mine', { cache: 'no-store' }))).holds,
    refetchInterval: 15_000,
  });
  const deviceNow = useClock();
  // The server's clock decides phases; the device only ticks between answers.
  const now = deviceNow === null || !availability.data ? null : deviceNow + availability.data.offsetMs;
  const zone = useOwnTimeZone();

  const live = availability.data;
  const times = live ?? drop;
  const totals = (live?.stock ?? []).reduce((t, s) => ({ available: t.available + s.available, held: t.held + s.held }), { available: 0, held: 0 });
  const phase: DropPhase = live && now ? dropPhase({ status: drop.status, earlyAccessAt: times.earlyAccessAt ? new Date(times.earlyAccessAt) : null, opensAt: new Date(times.opensAt), closesAt: new Date(times.closesAt) }, new Date(now), totals) : (live?.phase ?? 'upcoming');
  const myHolds = (mine.data ?? []).filter((h) => h.batchId === drop.id && (!now || new Date(h.expiresAt).getTime() > now));
  const refresh = () => Promise.all([queryClient.invalidateQueries({ queryKey: ['availability', drop.id] }), queryClient.invalidateQueries({ queryKey: ['holds', 'mine'] })]);

  return (
    <div>
      <PhaseBanner phase={phase} drop={drop} times={times} now={now} zone={zone} />
      {phase === 'early_access' && !earlyAccess ? (
        <p role="status" className="mt-4 rounded-sm border border-paper-edge bg-paper p-3" data-testid="early-access-only">
          Right now only people invited from the {drop.design.name} waitlist can hold. The drop opens to everyone on{' '}
          {formatInZone(new Date(times.opensAt), zone ?? drop.studio.timeZone)}.
        </p>
      ) : null}
      {availability.isError ? (
        <p role="alert" className="mt-4 rounded-sm border border-ember/40 bg-ember-wash p-3 text-ember-deep">
          Live stock could not be loaded. We keep trying every few seconds.
        </p>
      ) : null}
      {returnedFromCheckout && myHolds.length > 0 ? (
        <p role="status" className="mt-4 rounded-sm border border-paper-edge bg-paper p-3">
          The payment was not finished, so nothing was charged. Your hold is still yours until its timer ends: you can pay again below.
        </p>
      ) : null}
      {myHolds.map((hold) => (
        <HeldPanel key={hold.id} hold={hold} now={now} onEnded={refresh} />
      ))}
      <ul className="mt-8 grid gap-6 sm:grid-cols-2 xl:grid-cols-4">
        {drop.finishes.map((finish) => (
          <FinishCard
            key={finish.finishId}
            drop={drop}
            finish={finish}
            stock={live?.stock.find((s) => s.finishId === finish.finishId)}
            phase={phase === 'early_access' && !earlyAccess ? 'upcoming' : phase}
            signedIn={signedIn}
            alreadyHeld={myHolds.some((h) => h.finishId === finish.finishId)}
            onHeld={refresh}
          />
        ))}
      </ul>
      {(phase === 'sold_out' || phase === 'closed' || (phase === 'early_access' && !earlyAccess)) && waitlistForm ? (
        <div className="mt-8 max-w-xl">{waitlistForm}</div>
      ) : null}
    </div>
  );
}

function PhaseBanner({ phase, drop, times, now, zone }: { phase: DropPhase; drop: DropView; times: { earlyAccessAt: string | null; opensAt: string; closesAt: string }; now: number | null; zone: string | null }) {
  const target = phase === 'upcoming' ? (times.earlyAccessAt ?? times.opensAt) : phase === 'early_access' ? times.opensAt : phase === 'open' ? times.closesAt : null;
  const label = phase === 'upcoming' ? (times.earlyAccessAt ? 'Early access in' : 'Opens in') : phase === 'early_access' ? 'Opens to everyone in' : 'Closes in';
  const left = target && now ? new Date(target).getTime() - now : null;
  // Announce politely and rarely: each whole minute, the last ten seconds, and the moment it changes.
  const announce =
    left === null ? '' : left > 60_000 ? `${label} ${Math.ceil(left / 60_000)} minutes` : left > 10_000 ? `${label} less than a minute` : `${label} a few seconds`;
  return (
    <section aria-labelledby="phase-title" className="rounded-sm border border-paper-edge bg-paper-deep/60 p-5">
      <p id="phase-title" className="flex items-center gap-2 text-sm font-semibold uppercase tracking-wider">
        <span aria-hidden="true" className={`inline-block h-2.5 w-2.5 rounded-full ${phase === 'open' ? 'bg-ember' : phase === 'early_access' ? 'bg-moss' : 'bg-ink-faint'}`} />
        {phaseWords[phase]}
      </p>
      {left !== null && phase !== 'open' ? (
        <p className="mt-2 font-display text-5xl text-ember-deep">
          <span className="sr-only">{label} </span>
          <span aria-hidden="true" className="figures" data-testid="countdown">{formatCountdown(left)}</span>
        </p>
      ) : null}
      <p className="sr-only" aria-live="polite">{phase === 'open' ? 'The drop is open.' : announce}</p>
      <dl className="mt-3 grid gap-1 text-sm text-ink-soft">
        {times.earlyAccessAt ? <TimeRow label="Early access" at={times.earlyAccessAt} zone={zone} studioZone={drop.studio.timeZone} /> : null}
        <TimeRow label="Opens to everyone" at={times.opensAt} zone={zone} studioZone={drop.studio.timeZone} />
        <TimeRow label="Closes" at={times.closesAt} zone={zone} studioZone={drop.studio.timeZone} />
      </dl>
    </section>
  );
}

function TimeRow({ label, at, zone, studioZone }: { label: string; at: string; zone: string | null; studioZone: string }) {
  const when = new Date(at);
  return (
    <div className="flex flex-wrap gap-x-2">
      <dt className="font-semibold text-ink">{label}</dt>
      <dd className="figures">
        {zone ? `${formatInZone(when, zone)} your time` : formatInZone(when, studioZone)}
        {zone && zone !== studioZone ? <span className="text-ink-faint"> · {formatInZone(when, studioZone)} at the studio</span> : null}
      </dd>
    </div>
  );
}

function stockWords(stock: { quantity: number; available: number; held: number } | undefined, phase: DropPhase): string {
  if (!stock) return 'Checking stock…';
  if (stock.available > 0) return `${stock.available} of ${stock.quantity} left`;
  if (stock.held > 0 && phase !== 'closed') return 'Held by others — may come back';
  return 'Sold out';
}

function FinishCard({ drop, finish, stock, phase, signedIn, alreadyHeld, onHeld }: {
  drop: DropView; finish: DropView['finishes'][number]; stock: Availability['stock'][number] | undefined; phase: DropPhase;
  signedIn: boolean; alreadyHeld: boolean; onHeld: () => Promise<unknown>;
}) {
  const [quantity, setQuantity] = useState(1);
  const messageId = useId();
  const hold = useMutation({
    mutationFn: async () =>
      readApiResponse<{ hold: MyHold }>(
        await fetch('/api/holds', {
          method: 'POST',
          headers: { 'Content-Type': 'application/json' },
          body: JSON.stringify({ batchId: drop.id, finishId: finish.finishId, quantity }),
        }),
      ),
    onSuccess: onHeld,
    onError: onHeld,
  });
  const canTry = (phase === 'open' || phase === 'early_access') && (stock?.available ?? 0) > 0 && !alreadyHeld;
  const error = hold.error instanceof ApiError ? hold.error : null;
  return (
    <li className="rounded-sm border border-paper-edge bg-paper p-4" data-testid={`finish-${finish.slug}`}>
      <div className="relative aspect-[4/5] overflow-hidden rounded-sm bg-paper-deep">
        {finish.photo ? <Image src={finish.photo.src} alt={finish.photo.alt} fill sizes="(min-width: 640px) 20rem, 92vw" className="object-cover" /> : null}
      </div>
      <div className="mt-3 flex items-baseline justify-between gap-3">
        <h3 className="text-xl font-medium">{finish.name}</h3>
        <Price value={finish.price} />
      </div>
      <p className="mt-1 text-sm text-ink-soft">{finish.description}</p>
      <p className="figures mt-3 font-semibold" aria-live="polite" data-testid="stock">
        {stockWords(stock, phase)}
      </p>
      {alreadyHeld ? (
        <p className="mt-3 text-sm font-semibold text-moss">You hold this finish: pay from the panel above.</p>
      ) : !signedIn ? (
        <Link href={`/sign-in?callbackUrl=${encodeURIComponent(`/drops/${drop.id}`)}`} className="mt-3 inline-block rounded-full border border-ink px-5 py-2 font-semibold">
          Sign in to hold
        </Link>
      ) : (
        <form
          className="mt-3 flex items-center gap-3"
          onSubmit={(event) => {
            event.preventDefault();
            hold.mutate();
          }}
        >
          {drop.perBuyerLimit > 1 ? (
            <label className="text-sm">
              <span className="sr-only">How many</span>
              <select value={quantity} onChange={(e) => setQuantity(Number(e.target.value))} className="rounded-sm border border-paper-edge bg-white px-2 py-2">
                {Array.from({ length: drop.perBuyerLimit }, (_, i) => (
                  <option key={i + 1} value={i + 1}>{i + 1}</option>
                ))}
              </select>
            </label>
          ) : null}
          <button
            type="submit"
            disabled={!canTry || hold.isPending}
            aria-describedby={messageId}
            className="rounded-full bg-ember px-6 py-2.5 font-semibold text-paper hover:bg-ember-deep disabled:cursor-not-allowed disabled:bg-paper-edge disabled:text-ink-soft"
          >
            {hold.isPending ? 'Holding…' : `Hold ${finish.name}`}
          </button>
        </form>
      )}
      <p id={messageId} role={error ? 'alert' : undefined} className="mt-2 min-h-5 text-sm font-semibold text-ember-deep">
        {error ? error.message : hold.error ? 'We could not reach the shop. Try again.' : ''}
      </p>
    </li>
  );
}

function HeldPanel({ hold, now, onEnded }: { hold: MyHold; now: number | null; onEnded: () => Promise<unknown> }) {
  const release = useMutation({
    mutationFn: async () => {
      const response = await fetch(`/api/holds/${hold.id}`, { method: 'DELETE' });
      if (!response.ok && response.status !== 404) await readApiResponse(response);
    },
    onSettled: onEnded,
  });
  const left = now ? new Date(hold.expiresAt).getTime() - now : null;
  return (
    <section aria-labelledby={`hold-${hold.id}`} className="mt-4 rounded-sm border-2 border-ember bg-ember-wash p-5" data-testid="my-hold">
      <h2 id={`hold-${hold.id}`} className="font-sans text-lg font-semibold text-ember-deep">
        Held for you: {hold.quantity} × {hold.finishName}
      </h2>
      <p className="mt-1">
        It is yours for{' '}
        <strong className="figures text-2xl" data-testid="hold-countdown">{left === null ? '…' : formatCountdown(left)}</strong> while you pay. After
        that it goes back to the batch.
      </p>
      <CheckoutForm holdId={hold.id} defaultCountry="IE" />
      <div className="mt-4 flex flex-wrap items-center gap-3">
        <button type="button" onClick={() => release.mutate()} disabled={release.isPending} className="rounded-full border border-ink px-5 py-2 font-semibold">
          {release.isPending ? 'Letting go…' : 'Let it go instead'}
        </button>
      </div>
    </section>
  );
}
