import { formatElapsed, type SellThroughSeries } from '@/lib/reports/sell-through';

/** The chart's points as a table, readable by everyone: only the rows where something changed, and the last. */
export function SellThroughTable({ series, stock }: { series: SellThroughSeries; stock: number }) {
  const rows = series.points.filter((p, i, all) => i === 0 || i === all.length - 1 || p.held !== all[i - 1]!.held || p.sold !== all[i - 1]!.sold);
  return (
    <div className="overflow-x-auto rounded-sm border border-paper-edge bg-paper">
      <table className="w-full text-left text-sm">
        <caption className="sr-only">Held and sold masks since the opening, at each point where they changed</caption>
        <thead className="border-b border-paper-edge text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-2 font-semibold">After opening</th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">Held</th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">Sold</th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">Left to hold</th>
          </tr>
        </thead>
        <tbody className="figures">
          {rows.map((p) => (
            <tr key={p.t} className="border-b border-paper-edge/60 last:border-0">
              <th scope="row" className="whitespace-nowrap px-3 py-1.5 font-semibold">{formatElapsed(p.t)}</th>
              <td className="px-3 py-1.5 text-right">{p.held}</td>
              <td className="px-3 py-1.5 text-right">{p.sold}</td>
              <td className="px-3 py-1.5 text-right">{Math.max(0, stock - p.held - p.sold)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="border-t border-paper-edge px-3 py-2 text-xs text-ink-soft">
        One point every {formatElapsed(series.bucketSeconds)}; rows where nothing changed are left out.
      </p>
    </div>
  );
}
