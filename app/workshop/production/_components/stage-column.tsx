'use client';

import { useState } from 'react';
import { nextStage, stageLabels, type LineStage } from '@/lib/production/stages';
import { moveLinesAction } from '../actions';
import { useBoardAction } from './board-status';
import type { BoardCard } from './board-types';
import { LineCard } from './line-card';

type Props = { title: string; stage: LineStage | null; cards: BoardCard[]; isOwner: boolean; empty: string };

/** One stage of the board. Masks chosen with their checkboxes move on together, all or none. */
export function StageColumn({ title, stage, cards, isOwner, empty }: Props) {
  const [chosen, setChosen] = useState<Set<string>>(new Set());
  const [move, moving] = useBoardAction(moveLinesAction, (result) => {
    if (result.ok) setChosen(new Set());
  });
  const next = stage ? nextStage(stage) : null;
  // Cards that left the column since they were ticked no longer count.
  const picked = cards.filter((card) => chosen.has(card.id) && !card.oversoldOpen).map((card) => card.id);
  const headingId = `stage-${stage ?? 'failed'}`;
  const toggle = (id: string, checked: boolean) =>
    setChosen((previous) => {
      const copy = new Set(previous);
      if (checked) copy.add(id);
      else copy.delete(id);
      return copy;
    });
  return (
    <section aria-labelledby={headingId} className="rounded-sm border border-paper-edge bg-paper-deep/60 p-2">
      <h2 id={headingId} className="px-1 text-lg font-medium">
        {title} <span className="figures text-ink-soft">({cards.length})</span>
      </h2>
      {next && cards.length > 0 ? (
        <form action={move} className="mt-1 px-1">
          <input type="hidden" name="lineIds" value={picked.join(',')} />
          <input type="hidden" name="from" value={stage!} />
          <input type="hidden" name="to" value={next} />
          <button type="submit" disabled={moving || picked.length === 0} className="rounded-full border border-ink px-3 py-1 text-sm font-semibold hover:bg-ink hover:text-paper disabled:opacity-50 disabled:hover:bg-transparent disabled:hover:text-ink">
            {moving ? 'Moving…' : `Move ${picked.length > 0 ? picked.length : 'chosen'} to ${stageLabels[next]}`}
          </button>
        </form>
      ) : null}
      {cards.length === 0 ? (
        <p className="mt-2 px-1 text-sm text-ink-faint">{empty}</p>
      ) : (
        <ul className="mt-2 grid gap-2">
          {cards.map((card) => (
            <LineCard
              key={card.id}
              card={card}
              isOwner={isOwner}
              selectable={Boolean(next) && !card.oversoldOpen}
              selected={chosen.has(card.id)}
              onSelect={(checked) => toggle(card.id, checked)}
            />
          ))}
        </ul>
      )}
    </section>
  );
}
