'use client';

import Link from 'next/link';
import type { ReactNode } from 'react';
import { failureFor, isFailed, nextStage, previousStage, stageLabels } from '@/lib/production/stages';
import { failLineAction, moveLinesAction, recastLineAction } from '../actions';
import { useBoardAction } from './board-status';
import type { BoardCard } from './board-types';

const quiet = 'rounded-full border border-paper-edge px-3 py-1 text-sm hover:border-ink disabled:opacity-60';

type Props = { card: BoardCard; isOwner: boolean; selected: boolean; onSelect: (checked: boolean) => void; selectable: boolean };

/** One mask: who it is for, its batch and ship-by, and the moves this person may make from here. */
export function LineCard({ card, isOwner, selected, onSelect, selectable }: Props) {
  const [move, moving] = useBoardAction(moveLinesAction);
  const [fail, failing] = useBoardAction(failLineAction);
  const [recast, recasting] = useBoardAction(recastLineAction);
  const busy = moving || failing || recasting;
  const next = nextStage(card.stage);
  const back = previousStage(card.stage);
  const failure = failureFor(card.stage);
  const checkboxId = `pick-${card.id}`;
  return (
    <li className="rounded-sm border border-paper-edge bg-paper p-3 text-sm shadow-sm">
      <div className="flex items-start gap-2">
        {selectable ? (
          <input
            id={checkboxId}
            type="checkbox"
            checked={selected}
            onChange={(event) => onSelect(event.target.checked)}
            className="mt-1 size-4 accent-ink"
          />
        ) : null}
        <label htmlFor={selectable ? checkboxId : undefined} className="grid gap-0.5">
          <span className="font-semibold">
            <span className="figures">{card.orderNumber}</span> · {card.designName} — {card.finishName}
          </span>
          <span className="text-ink-soft">{card.buyerName}</span>
          <span className="text-xs text-ink-faint">
            {card.batchName} · ships by <span className="figures">{card.shipBy}</span>
          </span>
        </label>
      </div>
      <div className="mt-2 flex flex-wrap gap-1">
        {card.late ? (
          <span className="rounded-sm border border-ember bg-ember-wash px-1.5 py-0.5 text-xs font-semibold text-ember-deep">
            <span aria-hidden="true">▲ </span>Late
          </span>
        ) : null}
        {isFailed(card.stage) ? (
          <span className="rounded-sm border border-paper-edge px-1.5 py-0.5 text-xs font-semibold text-ink-soft">{stageLabels[card.stage]}</span>
        ) : null}
      </div>
      {card.oversoldOpen ? (
        <p className="mt-2 text-xs text-ink-soft">
          Oversold: it waits for the owner&rsquo;s decision on{' '}
          <Link href={`/workshop/orders/${card.orderNumber}`} className="underline underline-offset-4">
            the order
          </Link>
          .
        </p>
      ) : (
        <div className="mt-2 flex flex-wrap gap-1">
          {next ? (
            <CardButton card={card} action={move} to={next} busy={busy} className="rounded-full bg-ink px-3 py-1 text-sm font-semibold text-paper disabled:opacity-60">
              {moving ? 'Moving…' : `${stageLabels[next]} →`}
            </CardButton>
          ) : null}
          {back ? (
            <CardButton card={card} action={move} to={back} busy={busy} className={quiet}>
              ← Back to {stageLabels[back]}
            </CardButton>
          ) : null}
          {isOwner && failure ? (
            <CardButton card={card} action={fail} busy={busy} className="rounded-full border border-ember/50 px-3 py-1 text-sm text-ember-deep hover:border-ember disabled:opacity-60">
              {failing ? 'Saving…' : `Mark ${stageLabels[failure].toLowerCase()}`}
            </CardButton>
          ) : null}
          {isOwner && isFailed(card.stage) ? (
            <CardButton card={card} action={recast} busy={busy} className={quiet}>
              {recasting ? 'Saving…' : 'Back to To cast (spare pull)'}
            </CardButton>
          ) : null}
          {!isOwner && isFailed(card.stage) ? <p className="text-xs text-ink-soft">The owner decides: a spare pull or a refund.</p> : null}
        </div>
      )}
    </li>
  );
}

type ButtonProps = { card: BoardCard; action: (formData: FormData) => void; to?: string; busy: boolean; className: string; children: ReactNode };

/** One move for one mask: the stage it was seen at goes along, so a move made meanwhile is not overwritten. */
function CardButton({ card, action, to, busy, className, children }: ButtonProps) {
  return (
    <form action={action}>
      <input type="hidden" name="lineIds" value={card.id} />
      <input type="hidden" name="lineId" value={card.id} />
      <input type="hidden" name="from" value={card.stage} />
      {to ? <input type="hidden" name="to" value={to} /> : null}
      <button type="submit" disabled={busy} className={className}>
        {children}
        <span className="sr-only">: {card.label}</span>
      </button>
    </form>
  );
}
