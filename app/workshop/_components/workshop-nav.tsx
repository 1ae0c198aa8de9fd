'use client';

import Link from 'next/link';
import { usePathname } from 'next/navigation';

const links = [
  { href: '/workshop', label: 'Overview' },
  { href: '/workshop/people', label: 'People' },
];

export function WorkshopNav() {
  const pathname = usePathname();
  return (
    <nav aria-label="Workshop">
      <ul className="flex gap-4 text-sm">
        {links.map((link) => {
          const current = pathname === link.href;
          return (
            <li key={link.href}>
              <Link
                href={link.href}
                aria-current={current ? 'page' : undefined}
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
