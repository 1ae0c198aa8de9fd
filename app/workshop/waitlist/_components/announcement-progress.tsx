'use client';

import { useQuery } from '@tanstack/react-query';
import type { AnnouncementProgress } from '@/lib/waitlist/workshop-view';

type Progress = { announcements: AnnouncementProgress[]; unfinished: boolean };

const kindWords: Record<AnnouncementProgress['kind'], string> = {
  announced: 'Announcement',
  early_access_reminder: 'Early-access reminder',
  correction: 'Correction',
};

function title(a: AnnouncementProgress): string {
  if (a.kind !== 'correction') return kindWords[a.kind];
  return `Correction ${a.revision} (${a.reason === 'cancelled' ? 'cancelled' : 'new times'})`;
}

function stateWords(a: AnnouncementProgress): string {
  if (a.state === 'cancelled') return 'Stopped: the batch was cancelled';
  if (a.state === 'queued') return 'Waiting to start';
  if (a.state === 'fanning_out') return 'Queuing people';
  return a.queued > 0 ? 'Sending' : 'Done';
}

async function fetchProgress(): Promise<Progress> {
  const response = await fetch('/api/workshop/waitlist/progress', { cache: 'no-store' });
  if (!response.ok) throw new Error('The sending progress could not be read.');
  return response.json() as Promise<Progress>;
}

/** Each announcement's messages: waiting, sent and failed, read from the outbox; polled every 2 s while any is unfinished. */
export function AnnouncementProgressList({ initial }: { initial: Progress }) {
  const { data, isError } = useQuery({
    queryKey: ['workshop', 'waitlist', 'progress'],
    queryFn: fetchProgress,
    initialData: initial,
    refetchInterval: (query) => (query.state.data?.unfinished ? 2_000 : false),
  });
  const announcements = data.announcements;
  if (announcements.length === 0) {
    return (
      <p className="rounded-sm border border-paper-edge bg-paper px-4 py-6 text-ink-soft">
        No announcements yet. When a batch is scheduled, its waitlist is written to and the sending shows here.
      </p>
    );
  }
  return (
    <>
      {isError ? (
        <p role="status" className="mb-2 text-sm text-ember-deep">
          The latest progress could not be read; the figures below may be a few seconds old. It tries again by itself.
        </p>
      ) : null}
      <ul className="divide-y divide-paper-edge rounded-sm border border-paper-edge bg-paper">
        {announcements.map((a) => {
          const total = a.queued + a.sent + a.failed;
          const done = a.sent + a.failed;
          const label = `${title(a)} of ${a.batchName} (${a.designName}): ${a.sent} of ${total} sent, ${a.failed} failed, ${a.queued} waiting`;
          return (
            <li key={a.id} className="px-4 py-3">
              <p className="flex flex-wrap items-baseline justify-between gap-x-4">
                <span className="font-semibold">
                  {title(a)} · {a.batchName} <span className="font-normal text-ink-soft">({a.designName})</span>
                </span>
                <span className="text-sm text-ink-soft">{stateWords(a)}</span>
              </p>
              <div
                role="progressbar"
                aria-label={label}
                aria-valuemin={0}
                aria-valuemax={Math.max(total, 1)}
                aria-valuenow={done}
                className="mt-2 h-2 w-full overflow-hidden rounded-full bg-paper-deep"
              >
                <div className="flex h-full">
                  <div className="h-full bg-moss" style={{ width: total ? `${(a.sent / total) * 100}%` : '0%' }} />
                  <div className="h-full bg-ember" style={{ width: total ? `${(a.failed / total) * 100}%` : '0%' }} />
                </div>
              </div>
              <p className="figures mt-1 text-sm text-ink-soft" aria-hidden="true">
                {a.sent.toLocaleString('en-GB')} sent · {a.failed.toLocaleString('en-GB')} failed · {a.queued.toLocaleString('en-GB')} waiting
                {a.state === 'queued_all' ? ` · ${total.toLocaleString('en-GB')} people` : ''}
              </p>
            </li>
          );
        })}
      </ul>
    </>
  );
}
