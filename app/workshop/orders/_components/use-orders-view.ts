'use client';

import { usePathname, useRouter, useSearchParams } from 'next/navigation';
import { useCallback } from 'react';

export const orderFilterKeys = ['q', 'batch', 'finish', 'state', 'stage', 'oversold', 'refunded', 'country'] as const;

/**
 * The table's view lives in the URL (filters, sort, page), so a view can be shared and survives a reload.
 * The server checks every value; here they are only read and written.
 */
export function useOrdersView() {
  const params = useSearchParams();
  const router = useRouter();
  const pathname = usePathname();

  /** Sets or clears (undefined or "") some values; any change but paging goes back to page 1. */
  const update = useCallback(
    (changes: Record<string, string | undefined>) => {
      const next = new URLSearchParams(params.toString());
      for (const [key, value] of Object.entries(changes)) {
        if (value === undefined || value === '') next.delete(key);
        else next.set(key, value);
      }
      if (!('page' in changes)) next.delete('page');
      const query = next.toString();
      router.replace(query ? `${pathname}?${query}` : pathname, { scroll: false });
    },
    [params, router, pathname],
  );

  const clearFilters = useCallback(() => update(Object.fromEntries(orderFilterKeys.map((key) => [key, undefined]))), [update]);
  const hasFilters = orderFilterKeys.some((key) => params.get(key));

  // The export is the same view without paging.
  const exportParams = new URLSearchParams(params.toString());
  exportParams.delete('page');
  exportParams.delete('perPage');

  return { params, query: params.toString(), exportQuery: exportParams.toString(), update, clearFilters, hasFilters };
}
