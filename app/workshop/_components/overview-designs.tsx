import type { WorkshopDesignRow } from '@/lib/catalogue/workshop';

const statusStyle = {
  published: 'bg-moss-wash text-moss',
  draft: 'bg-paper-deep text-ink-soft',
  retired: 'bg-paper-deep text-ink-faint line-through',
} as const;

/** Designs and finishes as the shop sees them. */
export function OverviewDesigns({ designs }: { designs: WorkshopDesignRow[] }) {
  if (designs.length === 0) return <p className="mt-2 text-ink-soft">No designs yet.</p>;
  return (
    <div className="mt-2 overflow-x-auto rounded-sm border border-paper-edge bg-paper">
      <table className="w-full text-left text-sm">
        <caption className="sr-only">Designs</caption>
        <thead className="border-b border-paper-edge text-ink-soft">
          <tr>
            <th scope="col" className="px-4 py-3 font-semibold">Design</th>
            <th scope="col" className="px-4 py-3 font-semibold">State</th>
            <th scope="col" className="px-4 py-3 font-semibold">Finishes</th>
            <th scope="col" className="px-4 py-3 text-right font-semibold">Photos</th>
          </tr>
        </thead>
        <tbody>
          {designs.map((design) => (
            <tr key={design.slug} className="border-b border-paper-edge/60 last:border-0">
              <th scope="row" className="px-4 py-3 text-base font-semibold">{design.name}</th>
              <td className="px-4 py-3">
                <span className={`rounded-full px-2 py-0.5 text-xs font-semibold ${statusStyle[design.status]}`}>{design.status}</span>
              </td>
              <td className="px-4 py-3">
                {design.finishes.map((f) => (f.status === 'published' ? f.name : `${f.name} (${f.status})`)).join(', ') || '—'}
              </td>
              <td className="figures px-4 py-3 text-right">{design.photoCount}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
