import { formatMoney, type Money } from '@/lib/money';

/** A price in tabular figures; totals always come from the server. */
export function Price({ value, className = '' }: { value: Money; className?: string }) {
  return <span className={`figures ${className}`}>{formatMoney(value)}</span>;
}
