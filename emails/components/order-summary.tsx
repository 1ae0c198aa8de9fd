import type { CSSProperties, ReactNode } from 'react';
import { formatMoney } from '@/lib/money';

// Shared by the order e-mails. One table per summary, marked as a data table so that the plain-text
// version lays it out in aligned columns instead of one cell a line.
const table = { borderCollapse: 'collapse', margin: '0 0 16px', width: '100%' } satisfies CSSProperties;
const cell = {
  borderBottom: '1px solid #ece4d6',
  fontFamily: 'Helvetica, Arial, sans-serif',
  fontSize: '15px',
  lineHeight: '22px',
  padding: '8px 0',
  verticalAlign: 'top',
} satisfies CSSProperties;
const amountCell = {
  ...cell,
  paddingLeft: '16px',
  textAlign: 'right',
  whiteSpace: 'nowrap',
} satisfies CSSProperties;
const note = { color: '#6b635a', fontSize: '13px', lineHeight: '18px' } satisfies CSSProperties;

export const smallPrint = {
  fontFamily: 'Helvetica, Arial, sans-serif',
  fontSize: '13px',
  lineHeight: '20px',
  margin: '0 0 16px',
};
export const heading = {
  fontFamily: 'Helvetica, Arial, sans-serif',
  fontSize: '15px',
  fontWeight: 600,
  lineHeight: '24px',
  margin: '24px 0 4px',
};

export function SummaryTable({ children }: { children: ReactNode }) {
  return (
    <table
      role="presentation"
      width="100%"
      cellPadding={0}
      cellSpacing={0}
      data-text-format="dataTable"
      style={table}
    >
      <tbody>{children}</tbody>
    </table>
  );
}

/** One row of a summary: a label on the left, a value (usually an amount) on the right. */
export function SummaryRow({
  label,
  value,
  note: rowNote,
  strong = false,
}: {
  label: ReactNode;
  value: ReactNode;
  note?: string;
  strong?: boolean;
}) {
  const weight = strong ? { fontWeight: 600 } : {};
  return (
    <tr>
      <td style={{ ...cell, ...weight }}>
        {label}
        {rowNote ? <div style={note}>{rowNote}</div> : null}
      </td>
      <td style={{ ...amountCell, ...weight }}>{value}</td>
    </tr>
  );
}

/** "Ibex in Old Bone": how a line is named to buyers and makers alike. */
export function lineName(designName: string, finishName: string): string {
  return `${designName} in ${finishName}`;
}

/** "A", "A and B", "A, B and C". */
export function joinWithAnd(items: string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

export function money(amountMinor: number, currency: string): string {
  return formatMoney({ amountMinor, currency });
}
