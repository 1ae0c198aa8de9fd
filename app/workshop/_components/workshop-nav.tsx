'use client';

import Link from 'next/link';
import { usePathname } from 'next/navigation';

const links = [
  { href: '/workshop', label: 'Overview' },
  { href: '/workshop/designs', label: 'Designs' },
  { href: '/workshop/molds', label: 'Molds' },
  { href: '/workshop/plan', label: 'Plan' },
  { href: '/workshop/batches', label: 'Batches' },
  { href: '/workshop/orders', label: 'Orders' },
  { href: '/workshop/production', label: 'Production' },
  { href: '/workshop/oversold', label: 'Oversold' },
  { href: '/workshop/people', label: 'People' },
  { href: '/workshop/audit', label: 'Audit log' },
  { href: '/workshop/settings', label: 'Settings' },
];

export function WorkshopNav() {
  const pathname = usePathname();
  return (
    <nav aria-label="Workshop">
      <ul className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
        {links.map((link) => {
          // An order's own page sits under Orders.
          const current = pathname === link.href || (link.href !== '/workshop' && pathname.startsWith(`${link.href}/`));
          return (
            <li key={link.href}>
              <Link
                href={link.href}
                aria-current={pathname === link.href ? 'page' : current ? 'true' : undefined}
                className={current ? 'font-semibold text-ink underline underline-offset-4' : 'text-ink-soft hover:text-ink'}
              >
                {link.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
