'use client';

import Link from 'next/link';
import { usePathname } from 'next/navigation';
import { useState } from 'react';

const links = [
  { href: '/workshop', label: 'Overview' },
  { href: '/workshop/designs', label: 'Designs' },
  { href: '/workshop/molds', label: 'Molds' },
  { href: '/workshop/plan', label: 'Plan' },
  { href: '/workshop/batches', label: 'Batches' },
  { href: '/workshop/orders', label: 'Orders' },
  { href: '/workshop/production', label: 'Production' },
  { href: '/workshop/oversold', label: 'Oversold' },
  { href: '/workshop/waitlist', label: 'Waitlist' },
  { href: '/workshop/people', label: 'People' },
  { href: '/workshop/audit', label: 'Audit log' },
  { href: '/workshop/settings', label: 'Settings' },
];

const isCurrent = (pathname: string, href: string) => pathname === href || (href !== '/workshop' && pathname.startsWith(`${href}/`));

/**
 * The workshop's sections. On a phone twelve links would fill the screen before the work does, so they fold
 * behind one button that names the section you are in; from a tablet's width up they sit in a row.
 */
export function WorkshopNav() {
  const pathname = usePathname();
  // The menu stays open only on the page it was opened on: following a link closes it.
  const [openOn, setOpenOn] = useState<string | null>(null);
  const open = openOn === pathname;
  const here = links.find((link) => isCurrent(pathname, link.href)) ?? links[0]!;
  return (
    <nav aria-label="Workshop">
      <button
        type="button"
        aria-expanded={open}
        aria-controls="workshop-sections"
        onClick={() => setOpenOn(open ? null : pathname)}
        className="rounded-full border border-paper-edge px-3 py-1 text-sm md:hidden"
      >
        {here.label} <span aria-hidden="true">{open ? '▴' : '▾'}</span>
        <span className="sr-only">: {open ? 'hide' : 'show'} the workshop sections</span>
      </button>
      <ul id="workshop-sections" className={`${open ? 'mt-2 grid grid-cols-2 gap-2' : 'hidden'} text-sm md:mt-0 md:flex md:flex-wrap md:gap-x-4 md:gap-y-1`}>
        {links.map((link) => {
          // An order's own page sits under Orders.
          const current = isCurrent(pathname, link.href);
          return (
            <li key={link.href}>
              <Link
                href={link.href}
                aria-current={pathname === link.href ? 'page' : current ? 'true' : undefined}
                className={`inline-block py-1 md:py-0 ${current ? 'font-semibold text-ink underline underline-offset-4' : 'text-ink-soft hover:text-ink'}`}
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
