import { flexRender, type RowData, type Table } from '@tanstack/react-table';
import type { ReactNode } from 'react';
import { cn } from '@/lib/cn';
import { Skeleton } from './states';

declare module '@tanstack/react-table' {
  interface ColumnMeta<TData extends RowData, TValue> {
    /** Numbers right-aligned so their digits line up. */
    align?: 'left' | 'right';
    /** Extra classes on this column's th and td (width, hide below a breakpoint). */
    className?: string;
  }
}

interface DataTableProps<T> {
  table: Table<T>;
  /** Names the table for assistive technology; shown only to screen readers. */
  caption: string;
  isLoading?: boolean;
  /** A newer page is on its way while the old rows stay visible. */
  isRefreshing?: boolean;
  skeletonRows?: number;
  empty?: ReactNode;
}

function SortMark({ direction }: { direction: false | 'asc' | 'desc' }) {
  return (
    <svg viewBox="0 0 12 16" className={cn('h-4 w-3 shrink-0', direction ? 'text-ink-800' : 'text-loam-400')} aria-hidden="true">
      <path d="M6 1 10.5 6h-9L6 1Z" fill="currentColor" opacity={direction === 'desc' ? 0.25 : 1} />
      <path d="M6 15 1.5 10h9L6 15Z" fill="currentColor" opacity={direction === 'asc' ? 0.25 : 1} />
    </svg>
  );
}

/**
 * Renders a TanStack table (columns defined by the caller, once, at module level). Sorting and
 * paging are the caller's business (server-side); this draws headers as sort buttons with
 * aria-sort, skeleton rows while the first page loads, and the empty state.
 */
export function DataTable<T>({ table, caption, isLoading = false, isRefreshing = false, skeletonRows = 8, empty }: DataTableProps<T>) {
  const rows = table.getRowModel().rows;
  const columnCount = table.getVisibleLeafColumns().length;

  return (
    <div
      className="overflow-x-auto rounded-xl border border-loam-200 bg-white shadow-sm"
      role="region"
      aria-label={caption}
      tabIndex={0}
    >
      <table className={cn('w-full border-collapse text-left', isRefreshing && 'opacity-70')} aria-busy={isLoading || isRefreshing}>
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-loam-100 text-sm text-loam-800">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => {
                const column = header.column;
                const sorted = column.getIsSorted();
                const meta = column.columnDef.meta;
                const label = header.isPlaceholder ? null : flexRender(column.columnDef.header, header.getContext());
                return (
                  <th
                    key={header.id}
                    scope="col"
                    aria-sort={column.getCanSort() ? (sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none') : undefined}
                    className={cn('px-4 py-2 font-semibold whitespace-nowrap', meta?.align === 'right' && 'text-right', meta?.className)}
                  >
                    {column.getCanSort() ? (
                      <button
                        type="button"
                        onClick={column.getToggleSortingHandler()}
                        className={cn(
                          '-mx-2 inline-flex min-h-11 items-center gap-1.5 rounded px-2 hover:bg-loam-200 hover:text-ink-900',
                          meta?.align === 'right' && 'flex-row-reverse',
                        )}
                      >
                        {label}
                        <SortMark direction={sorted} />
                      </button>
                    ) : (
                      <span className="inline-flex min-h-11 items-center">{label}</span>
                    )}
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody className="divide-y divide-loam-200">
          {isLoading &&
            Array.from({ length: skeletonRows }, (_, i) => (
              <tr key={`skeleton-${i}`}>
                {table.getVisibleLeafColumns().map((column) => (
                  <td key={column.id} className={cn('px-4 py-3.5', column.columnDef.meta?.className)}>
                    <Skeleton className={cn('h-4', i % 2 ? 'w-3/4' : 'w-5/6')} />
                  </td>
                ))}
              </tr>
            ))}
          {!isLoading && rows.length === 0 && (
            <tr>
              <td colSpan={columnCount} className="p-4">
                {empty}
              </td>
            </tr>
          )}
          {!isLoading &&
            rows.map((row) => (
              <tr key={row.id} className="hover:bg-loam-50">
                {row.getVisibleCells().map((cell) => {
                  const meta = cell.column.columnDef.meta;
                  return (
                    <td
                      key={cell.id}
                      className={cn('px-4 py-2.5 align-middle', meta?.align === 'right' && 'text-right tabular', meta?.className)}
                    >
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  );
                })}
              </tr>
            ))}
        </tbody>
      </table>
      {isLoading && <span className="sr-only" role="status">Loading rows…</span>}
    </div>
  );
}
