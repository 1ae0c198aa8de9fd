import type { FinishSales } from '@/lib/reports/drop-report';

/** Stock and sales of each finish in the batch. */
export function FinishTable({ finishes }: { finishes: FinishSales[] }) {
  const total = (key: 'stock' | 'sold' | 'heldNow' | 'refunded') => finishes.reduce((n, f) => n + f[key], 0);
  return (
    <div className="overflow-x-auto rounded-sm border border-paper-edge bg-paper">
      <table className="w-full text-left text-sm">
        <caption className="sr-only">Stock and sales by finish</caption>
        <thead className="border-b border-paper-edge text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-2 font-semibold">Finish</th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">Stock</th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">Sold</th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">Sell-through</th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">Held now</th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">Refunded masks</th>
          </tr>
        </thead>
        <tbody className="figures">
          {finishes.map((f) => (
            <tr key={f.finishId} className="border-b border-paper-edge/60 last:border-0">
              <th scope="row" className="px-3 py-2 font-semibold">{f.name}</th>
              <td className="px-3 py-2 text-right">{f.stock}</td>
              <td className="px-3 py-2 text-right">{f.sold}</td>
              <td className="px-3 py-2 text-right">{f.stock > 0 ? `${Math.round((f.sold / f.stock) * 100)}%` : '—'}</td>
              <td className="px-3 py-2 text-right">{f.heldNow}</td>
              <td className="px-3 py-2 text-right">{f.refunded}</td>
            </tr>
          ))}
        </tbody>
        <tfoot className="figures border-t border-paper-edge font-semibold">
          <tr>
            <th scope="row" className="px-3 py-2">All finishes</th>
            <td className="px-3 py-2 text-right">{total('stock')}</td>
            <td className="px-3 py-2 text-right">{total('sold')}</td>
            <td className="px-3 py-2 text-right">{total('stock') > 0 ? `${Math.round((total('sold') / total('stock')) * 100)}%` : '—'}</td>
            <td className="px-3 py-2 text-right">{total('heldNow')}</td>
            <td className="px-3 py-2 text-right">{total('refunded')}</td>
          </tr>
        </tfoot>
      </table>
    </div>
  );
}
