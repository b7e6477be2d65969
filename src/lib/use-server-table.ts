import { getCoreRowModel, useReactTable, type ColumnDef, type SortingState, type Updater } from '@tanstack/react-table';
import { useMemo } from 'react';

/**
 * A TanStack table whose rows are one page the server sorted and paged: the sort ("name" or
 * "-name") and the page live in the URL, so the table only reflects them and reports a new sort.
 * One column sorts at a time and a sort is never removed (the server always orders the list).
 */
export function useServerTable<Row extends { id: number }, Sort extends string>(options: {
  rows: Row[] | undefined;
  total: number | undefined;
  // eslint-disable-next-line @typescript-eslint/no-explicit-any -- column value types differ per column
  columns: ColumnDef<Row, any>[];
  sort: Sort;
  page: number;
  pageSize: number;
  onSort: (sort: Sort) => void;
}) {
  const { sort, onSort } = options;
  const sorting = useMemo<SortingState>(() => [{ id: sort.replace(/^-/, ''), desc: sort.startsWith('-') }], [sort]);
  return useReactTable({
    data: options.rows ?? [],
    columns: options.columns,
    getRowId: (row) => String(row.id),
    getCoreRowModel: getCoreRowModel(),
    manualPagination: true,
    manualSorting: true,
    manualFiltering: true,
    enableMultiSort: false,
    enableSortingRemoval: false,
    sortDescFirst: false,
    rowCount: options.total ?? 0,
    state: { sorting, pagination: { pageIndex: options.page - 1, pageSize: options.pageSize } },
    onSortingChange: (updater: Updater<SortingState>) => {
      const first = (typeof updater === 'function' ? updater(sorting) : updater)[0];
      if (first) onSort(`${first.desc ? '-' : ''}${first.id}` as Sort);
    },
  });
}
