import type { DesignDetail } from '@/lib/catalogue/designs';

const rows: { key: keyof DesignDetail['fit']; label: string; unit: string }[] = [
  { key: 'widthMm', label: 'Width', unit: 'mm' },
  { key: 'heightMm', label: 'Height', unit: 'mm' },
  { key: 'depthMm', label: 'Depth', unit: 'mm' },
  { key: 'weightG', label: 'Weight', unit: 'g' },
  { key: 'eyeOpeningWidthMm', label: 'Eye openings', unit: 'mm wide' },
  { key: 'eyeSpacingMm', label: 'Eye centres', unit: 'mm apart' },
];

export function FitTable({ fit }: { fit: DesignDetail['fit'] }) {
  const known = rows.filter((row) => fit[row.key] !== null);
  if (known.length === 0) return null;
  return (
    <section className="mt-10" aria-labelledby="fit-title">
      <h2 id="fit-title" className="text-2xl font-medium">
        Fit
      </h2>
      <dl className="mt-3 grid grid-cols-2 gap-x-6 gap-y-3 sm:grid-cols-3">
        {known.map((row) => (
          <div key={row.key}>
            <dt className="text-sm text-ink-faint">{row.label}</dt>
            <dd className="figures text-lg">
              {fit[row.key]} {row.unit}
            </dd>
          </div>
        ))}
      </dl>
    </section>
  );
}
