import type { DesignStatus } from '@/models';

// A design's or finish's state, said in words with its own mark; colour only repeats what the words say.
export const statusLabels: Record<DesignStatus, string> = {
  draft: 'Draft',
  published: 'Published',
  retired: 'Retired',
};

export const statusMeaning: Record<DesignStatus, string> = {
  draft: 'not in the shop',
  published: 'in the shop',
  retired: 'no longer in the shop',
};

const marks: Record<DesignStatus, { mark: string; style: string }> = {
  draft: { mark: '◇', style: 'border-paper-edge bg-paper-deep text-ink-soft' },
  published: { mark: '●', style: 'border-moss/40 bg-moss-wash text-moss' },
  retired: { mark: '○', style: 'border-paper-edge bg-paper text-ink-faint' },
};

export function StatusBadge({ status, withMeaning = false }: { status: DesignStatus; withMeaning?: boolean }) {
  const { mark, style } = marks[status];
  return (
    <span className={`inline-flex items-center gap-1 whitespace-nowrap rounded-full border px-2 py-0.5 text-xs font-semibold ${style}`}>
      <span aria-hidden="true">{mark}</span>
      {statusLabels[status]}
      {withMeaning ? <span className="font-normal">· {statusMeaning[status]}</span> : null}
    </span>
  );
}

/** The buttons a state offers: draft → published → retired → draft. */
export const statusMoves: Record<DesignStatus, { to: DesignStatus; label: string }[]> = {
  draft: [{ to: 'published', label: 'Publish' }],
  published: [{ to: 'retired', label: 'Retire' }],
  retired: [{ to: 'draft', label: 'Back to draft' }],
};
