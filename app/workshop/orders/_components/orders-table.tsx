'use client';

import { keepPreviousData, useQuery, useQueryClient } from '@tanstack/react-query';
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type RowSelectionState } from '@tanstack/react-table';
import Link from 'next/link';
import { useState } from 'react';
import { Price } from '@/components/ui/price';
import { ApiError, readApiResponse } from '@/lib/api/client';
import type { WorkshopOrderRow, WorkshopOrderSort, WorkshopOrdersPage } from '@/lib/orders/workshop-list';
import { OrderStateBadge, OversoldBadge } from './badges';
import { OrdersBulkBar } from './orders-bulk-bar';
import { OrdersFilters, type FilterOption } from './orders-filters';
import { StudioTime } from './studio-time';
import { useOrdersView } from './use-orders-view';

type Props = {
  zone: string;
  batches: FilterOption[];
  finishes: FilterOption[];
};

// Newest, biggest first; words and codes A to Z.
const firstDir: Record<WorkshopOrderSort, 'asc' | 'desc'> = { placed: 'desc', total: 'desc', number: 'desc', state: 'asc', country: 'asc' };
const sortNames: Record<WorkshopOrderSort, string> = { number: 'order', placed: 'placed', total: 'total', state: 'state', country: 'country' };
const perPageChoices = [10, 25, 50, 100];

const column = createColumnHelper<WorkshopOrderRow>();

async function fetchOrders(query: string): Promise<WorkshopOrdersPage> {
  return readApiResponse<WorkshopOrdersPage>(await fetch(`/api/workshop/orders${query ? `?${query}` : ''}`, { cache: 'no-store' }));
}

export function OrdersTable({ zone, batches, finishes }: Props) {
  const view = useOrdersView();
  const queryClient = useQueryClient();
  const orders = useQuery({ queryKey: ['workshop-orders', view.query], queryFn: () => fetchOrders(view.query), placeholderData: keepPreviousData });
  // A selection belongs to the view it was made in: another page or filter starts with none.
  const [selection, setSelection] = useState<{ view: string; rows: RowSelectionState }>({ view: view.query, rows: {} });
  const rowSelection = selection.view === view.query ? selection.rows : {};

  const sort = (view.params.get('sort') ?? 'placed') as WorkshopOrderSort;
  const dir = view.params.get('dir') ?? 'desc';
  const data = orders.data;

  const columns = [
    column.display({
      id: 'select',
      header: ({ table }) => (
        <input
          type="checkbox"
          aria-label="Select every order on this page"
          checked={table.getIsAllPageRowsSelected()}
          ref={(el) => {
            if (el) el.indeterminate = table.getIsSomePageRowsSelected();
          }}
          onChange={table.getToggleAllPageRowsSelectedHandler()}
        />
      ),
      cell: ({ row }) => (
        <input type="checkbox" aria-label={`Select order ${row.original.number}`} checked={row.getIsSelected()} onChange={row.getToggleSelectedHandler()} />
      ),
    }),
    column.accessor('number', {
      id: 'number',
      header: 'Order',
      cell: ({ row }) => (
        <Link href={`/workshop/orders/${row.original.number}`} className="figures font-semibold underline underline-offset-4 hover:text-ember-deep">
          {row.original.number}
        </Link>
      ),
    }),
    column.accessor('placedAt', { id: 'placed', header: 'Placed', cell: ({ getValue }) => <StudioTime at={getValue()} zone={zone} /> }),
    column.display({
      id: 'buyer',
      header: 'Buyer',
      cell: ({ row: { original: o } }) => (
        <>
          {o.buyerName ? <span className="block">{o.buyerName}</span> : null}
          <span className={o.buyerName ? 'block text-ink-soft' : 'block'}>{o.email}</span>
        </>
      ),
    }),
    column.display({
      id: 'masks',
      header: 'Masks',
      cell: ({ row: { original: o } }) => (
        <>
          {o.items.map((item) => (
            <span key={`${item.design}|${item.finish}`} className="block">
              {item.design} — {item.finish} <span className="figures">× {item.count}</span>
            </span>
          ))}
          <span className="block text-xs text-ink-faint">{o.batchName}</span>
        </>
      ),
    }),
    column.accessor('totalMinor', {
      id: 'total',
      header: 'Total',
      cell: ({ row: { original: o } }) => (
        <>
          <Price value={{ amountMinor: o.totalMinor, currency: o.currency }} />
          {o.refundedMinor > 0 ? (
            <span className="block text-xs text-ink-soft">
              Refunded <Price value={{ amountMinor: o.refundedMinor, currency: o.currency }} />
            </span>
          ) : null}
        </>
      ),
    }),
    column.accessor('state', {
      id: 'state',
      header: 'State',
      cell: ({ row: { original: o } }) => (
        <span className="flex flex-wrap gap-1">
          <OrderStateBadge state={o.state} />
          {o.oversoldOpen > 0 ? <OversoldBadge count={o.oversoldOpen} /> : null}
        </span>
      ),
    }),
    column.accessor('country', { id: 'country', header: 'Ships to', cell: ({ getValue }) => <span className="figures">{getValue()}</span> }),
  ];

  // The React Compiler is not on, so TanStack Table's unmemoizable functions are fine here.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: data?.rows ?? [],
    columns,
    getCoreRowModel: getCoreRowModel(),
    getRowId: (row) => row.id,
    manualPagination: true,
    manualSorting: true,
    manualFiltering: true,
    rowCount: data?.total ?? 0,
    enableRowSelection: true,
    state: {
      rowSelection,
      sorting: [{ id: sort, desc: dir === 'desc' }],
      pagination: { pageIndex: (data?.page ?? 1) - 1, pageSize: data?.perPage ?? 25 },
    },
    onRowSelectionChange: (updater) =>
      setSelection({ view: view.query, rows: typeof updater === 'function' ? updater(rowSelection) : updater }),
  });

  function sortBy(id: WorkshopOrderSort) {
    const nextDir = id === sort ? (dir === 'desc' ? 'asc' : 'desc') : firstDir[id];
    view.update({ sort: id === 'placed' ? undefined : id, dir: nextDir === 'desc' ? undefined : nextDir });
  }

  const error = orders.error instanceof ApiError ? orders.error : null;
  const fieldErrors = (error?.details?.fields ?? {}) as Record<string, string[]>;
  const selectedIds = new Set(Object.keys(rowSelection).filter((id) => rowSelection[id]));
  // A selection lives on one page of one view, so its rows are the ones shown.
  const selectedOrders = (data?.rows ?? []).filter((row) => selectedIds.has(row.id)).map((row) => ({ id: row.id, number: row.number }));
  const sortable = (id: string): id is WorkshopOrderSort => id in firstDir;

  return (
    <>
      <OrdersFilters
        params={view.params}
        batches={batches}
        finishes={finishes}
        fieldErrors={fieldErrors}
        update={view.update}
        clearFilters={view.clearFilters}
        hasFilters={view.hasFilters}
      />

      <div className="mt-4 flex flex-wrap items-center justify-between gap-3 text-sm">
        <p role="status" aria-live="polite" className="text-ink-soft">
          {orders.isPending ? 'Loading orders…' : data ? `${data.total} ${data.total === 1 ? 'order' : 'orders'}${orders.isFetching ? ' · updating…' : ''}` : ''}
        </p>
        <a href={`/api/workshop/orders/export${view.exportQuery ? `?${view.exportQuery}` : ''}`} className="rounded-full border border-ink px-4 py-1 font-semibold" download>
          Download CSV<span className="sr-only"> of every order in this view</span>
        </a>
      </div>

      {orders.isError ? (
        <div role="alert" className="mt-4 rounded-sm border border-ember bg-ember-wash px-4 py-3 text-ember-deep">
          <p>{orders.error.message}</p>
          {error?.status === 400 ? (
            <button type="button" onClick={view.clearFilters} className="mt-1 underline underline-offset-4">
              Clear filters
            </button>
          ) : (
            <button type="button" onClick={() => orders.refetch()} className="mt-1 underline underline-offset-4">
              Try again
            </button>
          )}
        </div>
      ) : null}

      {data && data.total === 0 ? (
        <p className="mt-4 rounded-sm border border-paper-edge bg-paper px-4 py-6 text-ink-soft">
          {view.hasFilters
            ? 'No orders match these filters. Loosen one, or clear them all.'
            : 'No paid orders yet. When a buyer pays for a drop, the order appears here with its masks, total and state.'}
        </p>
      ) : null}

      {data && data.total > 0 && data.rows.length === 0 ? (
        <p className="mt-4 rounded-sm border border-paper-edge bg-paper px-4 py-6 text-ink-soft">
          This view has {data.pageCount} {data.pageCount === 1 ? 'page' : 'pages'}; page {data.page} is past the last one.{' '}
          <button type="button" onClick={() => view.update({ page: undefined })} className="underline underline-offset-4">
            Go to the first page
          </button>
        </p>
      ) : null}

      {orders.isPending || (data && data.rows.length > 0) ? (
        <div
          role="region"
          aria-label="Orders"
          tabIndex={0}
          className={`mt-4 overflow-x-auto rounded-sm border border-paper-edge bg-paper ${orders.isFetching && !orders.isPending ? 'opacity-60' : ''}`}
        >
          <table className="w-full min-w-[56rem] text-left text-sm" aria-busy={orders.isFetching}>
            <caption className="sr-only">Orders, sorted by {sortNames[sort]}, {dir === 'asc' ? 'ascending' : 'descending'}</caption>
            <thead className="border-b border-paper-edge text-ink-soft">
              {table.getHeaderGroups().map((group) => (
                <tr key={group.id}>
                  {group.headers.map((header) => {
                    const id = header.column.id;
                    const sorted = header.column.getIsSorted();
                    const label = flexRender(header.column.columnDef.header, header.getContext());
                    return (
                      <th
                        key={header.id}
                        scope="col"
                        aria-sort={sortable(id) ? (sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none') : undefined}
                        className={`px-3 py-2 font-semibold ${id === 'total' ? 'text-right' : ''} ${id === 'select' ? 'w-8' : ''}`}
                      >
                        {sortable(id) ? (
                          <button type="button" onClick={() => sortBy(id)} className="inline-flex items-center gap-1 hover:text-ink">
                            {label}
                            <span aria-hidden="true">{sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}</span>
                          </button>
                        ) : (
                          label
                        )}
                      </th>
                    );
                  })}
                </tr>
              ))}
            </thead>
            <tbody>
              {orders.isPending
                ? Array.from({ length: 5 }, (_, i) => (
                    <tr key={i} className="border-b border-paper-edge/60 last:border-0">
                      {columns.map((c) => (
                        <td key={c.id} className="px-3 py-3">
                          <span className="block h-3 animate-pulse rounded-sm bg-paper-deep" />
                        </td>
                      ))}
                    </tr>
                  ))
                : table.getRowModel().rows.map((row) => (
                    <tr key={row.id} className={`border-b border-paper-edge/60 align-top last:border-0 ${row.getIsSelected() ? 'bg-paper-deep/60' : ''}`}>
                      {row.getVisibleCells().map((cell) => (
                        <td key={cell.id} className={`px-3 py-2 ${cell.column.id === 'total' ? 'text-right' : ''}`}>
                          {flexRender(cell.column.columnDef.cell, cell.getContext())}
                        </td>
                      ))}
                    </tr>
                  ))}
            </tbody>
          </table>
        </div>
      ) : null}

      <OrdersBulkBar
        orders={selectedOrders}
        onClear={() => setSelection({ view: view.query, rows: {} })}
        onDone={() => queryClient.invalidateQueries({ queryKey: ['workshop-orders'] })}
      />

      {data && data.total > 0 ? (
        <nav aria-label="Pages of orders" className="mt-4 flex flex-wrap items-center justify-between gap-3 text-sm">
          <p className="figures">
            Page {data.page} of {Math.max(data.pageCount, 1)}
          </p>
          <div className="flex items-center gap-2">
            <button
              type="button"
              disabled={!table.getCanPreviousPage()}
              onClick={() => view.update({ page: data.page > 2 ? String(data.page - 1) : undefined })}
              className="rounded-full border border-paper-edge px-4 py-1 disabled:text-ink-faint"
            >
              Previous
            </button>
            <button
              type="button"
              disabled={!table.getCanNextPage()}
              onClick={() => view.update({ page: String(data.page + 1) })}
              className="rounded-full border border-paper-edge px-4 py-1 disabled:text-ink-faint"
            >
              Next
            </button>
            <label className="ml-2 flex items-center gap-1">
              <span className="text-ink-soft">Per page</span>
              <select
                value={data.perPage}
                onChange={(event) => view.update({ perPage: event.target.value === '25' ? undefined : event.target.value })}
                className="rounded-sm border border-paper-edge bg-paper px-2 py-1"
              >
                {perPageChoices.map((n) => (
                  <option key={n} value={n}>
                    {n}
                  </option>
                ))}
              </select>
            </label>
          </div>
        </nav>
      ) : null}
    </>
  );
}
