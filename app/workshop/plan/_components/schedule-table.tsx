import { formatMinutes, formatShortDay } from '@/lib/planner/format';
import type { Schedule } from '@/lib/planner/schedule';

/** The schedule day by day, as a table: what the chart shows, readable by everyone. */
export function ScheduleTable({ schedule }: { schedule: Schedule }) {
  const cell = (minutes: number) => (minutes > 0 ? formatMinutes(minutes) : '—');
  return (
    <div className="overflow-x-auto rounded-sm border border-paper-edge bg-paper">
      <table className="w-full text-left text-sm">
        <caption className="sr-only">The schedule, one working day a row</caption>
        <thead className="border-b border-paper-edge text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-2 font-semibold">Day</th>
            <th scope="col" className="px-3 py-2 font-semibold">Mold making</th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">Pulls cast</th>
            <th scope="col" className="px-3 py-2 font-semibold">Trimming</th>
            <th scope="col" className="px-3 py-2 font-semibold">Painting</th>
            <th scope="col" className="px-3 py-2 font-semibold">Packing</th>
            <th scope="col" className="px-3 py-2 font-semibold">Handling</th>
          </tr>
        </thead>
        <tbody className="figures">
          {schedule.days.map((day) => (
            <tr key={day.date} className="border-b border-paper-edge/60 last:border-0">
              <th scope="row" className="whitespace-nowrap px-3 py-1.5 font-semibold">
                {day.index + 1}. {formatShortDay(day.date)}
              </th>
              <td className="px-3 py-1.5">{cell(day.moldMakingMinutes)}</td>
              <td className="px-3 py-1.5 text-right">{day.pulls > 0 ? day.pulls : '—'}</td>
              <td className="px-3 py-1.5">{cell(day.trimMinutes)}</td>
              <td className="px-3 py-1.5">{cell(day.paintMinutes)}</td>
              <td className="px-3 py-1.5">{cell(day.packMinutes)}</td>
              <td className="px-3 py-1.5">{day.handling ? 'Handling' : '—'}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
