import { formatMoney } from '@/lib/money';
import type { Plan } from '@/lib/planner/plan';

const grams = (g: number) => `${Math.round(g).toLocaleString('en-IE')} g`;

/** Resin per mask and the money per mask for each finish at its chosen price. */
export function MoneyTable({ plan, currency, weightG }: { plan: Plan; currency: string; weightG: number | null }) {
  const { resin, money, schedule } = plan;
  const m = (minor: number) => formatMoney({ amountMinor: minor, currency });
  const batchResinKg = (resin.perPullG * schedule.pulls) / 1000;
  return (
    <div className="grid gap-4">
      <dl className="grid grid-cols-2 gap-x-4 gap-y-2 rounded-sm border border-paper-edge bg-paper p-4 text-sm sm:grid-cols-3">
        <div>
          <dt className="text-ink-soft">Shell volume</dt>
          <dd className="figures font-semibold">{Math.round(resin.volumeCm3).toLocaleString('en-IE')} cm³</dd>
        </div>
        <div>
          <dt className="text-ink-soft">Resin in one shell</dt>
          <dd className="figures font-semibold">{grams(resin.shellMassG)}</dd>
        </div>
        <div>
          <dt className="text-ink-soft">Resin a pull, with waste</dt>
          <dd className="figures font-semibold">{grams(resin.perPullG)}</dd>
        </div>
        <div>
          <dt className="text-ink-soft">Resin a kept mask, failed pulls shared</dt>
          <dd className="figures font-semibold">{grams(resin.perKeptMaskG)}</dd>
        </div>
        <div>
          <dt className="text-ink-soft">Resin for the batch</dt>
          <dd className="figures font-semibold">{batchResinKg.toLocaleString('en-IE', { maximumFractionDigits: 1 })} kg</dd>
        </div>
        {weightG ? (
          <div>
            <dt className="text-ink-soft">Listed weight of the finished mask</dt>
            <dd className="figures font-semibold">{grams(weightG)} <span className="font-normal text-ink-soft">(with padding and strap)</span></dd>
          </div>
        ) : null}
      </dl>
      <div className="overflow-x-auto rounded-sm border border-paper-edge bg-paper">
        <table className="w-full text-left text-sm">
          <caption className="sr-only">Money per mask, by finish</caption>
          <thead className="border-b border-paper-edge text-ink-soft">
            <tr>
              <th scope="col" className="px-3 py-2 font-semibold">Finish</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Price</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Tax in price</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Resin</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Paint</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Packaging</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Card fee</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Margin</th>
            </tr>
          </thead>
          <tbody className="figures">
            {money.map((row) => (
              <tr key={row.finishId} className="border-b border-paper-edge/60 last:border-0">
                <th scope="row" className="px-3 py-2 font-semibold">{row.name}</th>
                <td className="px-3 py-2 text-right">{m(row.priceMinor)}</td>
                <td className="px-3 py-2 text-right">{m(row.taxIncludedMinor)}</td>
                <td className="px-3 py-2 text-right">{m(row.resinMinor)}</td>
                <td className="px-3 py-2 text-right">{m(row.paintMinor)}</td>
                <td className="px-3 py-2 text-right">{m(row.packagingMinor)}</td>
                <td className="px-3 py-2 text-right">{m(row.cardFeeMinor)}</td>
                <td className={`px-3 py-2 text-right font-semibold ${row.marginMinor < 0 ? 'text-ember-deep' : ''}`}>
                  {row.marginMinor < 0 ? <span aria-hidden="true">▼ </span> : null}
                  {m(row.marginMinor)}
                  {row.marginBasisPoints !== null ? (
                    <span className="block text-xs font-normal text-ink-soft">{(row.marginBasisPoints / 100).toFixed(1)}% after tax</span>
                  ) : null}
                  {row.marginMinor < 0 ? <span className="sr-only"> (a loss)</span> : null}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="text-xs text-ink-soft">
        Margin is the price less the tax it includes, the resin, paint, packaging and card fee, with one mask to a card
        payment. Your own hours are not counted in it.
      </p>
    </div>
  );
}
