/** The workshop's usual cautions for the materials a batch uses. */
export function MaterialsCaution() {
  return (
    <aside aria-labelledby="materials-caution-title" className="rounded-sm border border-paper-edge bg-paper px-4 py-3 text-sm text-ink-soft">
      <h2 id="materials-caution-title" className="flex items-center gap-2 font-sans text-sm font-semibold text-ink">
        <span aria-hidden="true">▲</span> Materials cautions
      </h2>
      <p className="mt-1">
        Polyurethane resins and their solvents give off vapours, and cutting or sanding fibreglass makes fine dust. Work with
        good ventilation, wear a suitable respirator, gloves and eye protection, and follow each product&rsquo;s safety data
        sheet. The figures here are planning estimates; local codes and licensed practice come first.
      </p>
    </aside>
  );
}
