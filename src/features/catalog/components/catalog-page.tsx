import { useQuery, useQueryClient } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { createContext, use, useMemo, useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { componentCategories, type ComponentCategory } from '@shared/schemas/fleet';
import { Button } from '@/components/ui/button';
import { useServerTable } from '@/lib/use-server-table';
import { useUrlSearch } from '@/lib/use-url-search';
import { DataTable } from '@/components/ui/data-table';
import { Dialog } from '@/components/ui/dialog';
import { inputClasses } from '@/components/ui/form-field';
import { PageHeader } from '@/components/ui/page-header';
import { Pagination } from '@/components/ui/pagination';
import { EmptyState, ErrorState } from '@/components/ui/states';
import { StatusBadge } from '@/components/ui/status-badge';
import { useCurrentUser } from '@/features/auth/components/current-user';
import { GlyphIcon } from '@/features/fleet/components/component-glyph';
import { ConfirmDeleteDialog } from '@/features/fleet/components/confirm-delete-dialog';
import { Notice } from '@/features/fleet/components/form-bits';
import { categoryLabels, formatNumber, formatUsd, unitLabels } from '@/features/fleet/lib/labels';
import { catalogKeys, catalogListQueryOptions, type CatalogComponent, type CatalogFilters, type CatalogSort } from '../api/components';
import { catalogPageSizes, parseCatalogParams, toCatalogParams } from '../api/list-params';
import { useDeleteComponentMutation, useSaveComponentMutation } from '../api/save-component';
import { ComponentForm } from './component-form';

interface CatalogTableContext {
  canEdit: boolean;
  onEdit: (c: CatalogComponent) => void;
}
const TableContext = createContext<CatalogTableContext | null>(null);
function useTableContext() {
  const value = use(TableContext);
  if (!value) throw new Error('Catalog cells need TableContext');
  return value;
}

const column = createColumnHelper<CatalogComponent>();
const dash = <span className="text-loam-700">—</span>;

const columns = [
  column.accessor('partNumber', {
    header: 'Part no.',
    cell: (info) => <span className="font-mono font-semibold whitespace-nowrap text-ink-900">{info.getValue()}</span>,
  }),
  column.accessor('name', {
    header: 'Component',
    cell: (info) => (
      <span className="block min-w-40">
        <span className="font-semibold text-ink-900">{info.getValue()}</span>
        {info.row.original.maker && <span className="block text-sm text-loam-700">{info.row.original.maker}</span>}
      </span>
    ),
  }),
  column.accessor('category', {
    header: 'Category',
    cell: (info) => (
      <span className="inline-flex items-center gap-2">
        <GlyphIcon category={info.getValue()} size={18} />
        {categoryLabels[info.getValue()] ?? info.getValue()}
      </span>
    ),
  }),
  column.accessor('unit', { header: 'Sold', enableSorting: false, cell: (info) => <span className="whitespace-nowrap">{unitLabels[info.getValue()]}</span> }),
  column.accessor('priceUsd', { header: 'Price', meta: { align: 'right' }, cell: (info) => formatUsd(info.getValue()) }),
  column.accessor('labourHours', { header: 'Labour', enableSorting: false, meta: { align: 'right', className: 'hidden 2xl:table-cell' }, cell: (info) => `${formatNumber(info.getValue(), 2)} h` }),
  column.accessor('expectedLifeYears', { header: 'Life', enableSorting: false, meta: { align: 'right', className: 'hidden 2xl:table-cell' }, cell: (info) => `${formatNumber(info.getValue())} yr` }),
  column.accessor('hydraulicGpm', {
    header: 'Oil',
    enableSorting: false,
    meta: { align: 'right', className: 'hidden 2xl:table-cell' },
    cell: (info) => (info.getValue() === null ? dash : `${formatNumber(info.getValue()!, 2)} gpm`),
  }),
  column.accessor('active', {
    header: 'Status',
    enableSorting: false,
    cell: (info) =>
      info.getValue() ? (
        <StatusBadge tone="good" shape="dot">Active</StatusBadge>
      ) : (
        <StatusBadge tone="neutral" shape="dash">Inactive</StatusBadge>
      ),
  }),
  column.display({
    id: 'actions',
    header: () => <span className="sr-only">Actions</span>,
    meta: { align: 'right' },
    cell: (info) => <ActionsCell component={info.row.original} />,
  }),
];

/** Edit opens the form (which also offers Delete): one button a row keeps the table within 1280 px. */
function ActionsCell({ component }: { component: CatalogComponent }) {
  const { canEdit, onEdit } = useTableContext();
  if (!canEdit) return null;
  return (
    // "relative": the screen-reader-only name is positioned inside the table's scroller, not the page.
    <div className="relative flex justify-end">
      <Button variant="secondary" className="px-3" onClick={() => onEdit(component)}>
        Edit<span className="sr-only"> {component.partNumber}</span>
      </Button>
    </div>
  );
}

type Editing = { mode: 'create' } | { mode: 'update'; component: CatalogComponent } | null;

/** The component catalog: staff read it; admins and managers add, change and delete parts. */
export function CatalogPage() {
  const user = useCurrentUser();
  const canEdit = user.role === 'admin' || user.role === 'manager';
  const [searchParams, setSearchParams] = useSearchParams();
  const filters = useMemo(() => parseCatalogParams(searchParams), [searchParams]);
  const setFilters = (patch: Partial<CatalogFilters>, options: { replace?: boolean } = {}) =>
    setSearchParams((current) => toCatalogParams({ ...parseCatalogParams(current), ...patch }), { replace: options.replace ?? false });
  const catalog = useQuery(catalogListQueryOptions(filters));
  const save = useSaveComponentMutation();
  const remove = useDeleteComponentMutation();
  const queryClient = useQueryClient();
  const [editing, setEditing] = useState<Editing>(null);
  const [deleting, setDeleting] = useState<CatalogComponent | null>(null);
  const [notice, setNotice] = useState<string | null>(null);

  const [searchText, setSearchText] = useUrlSearch(filters.q, (q) => setFilters({ q, page: 1 }, { replace: true }));

  const table = useServerTable({
    rows: catalog.data?.items,
    total: catalog.data?.total,
    columns,
    sort: filters.sort,
    page: filters.page,
    pageSize: filters.pageSize,
    onSort: (sort) => setFilters({ sort, page: 1 }),
  });
  const context = useMemo<CatalogTableContext>(() => ({ canEdit, onEdit: (c) => setEditing({ mode: 'update', component: c }) }), [canEdit]);
  const total = catalog.data?.total ?? 0;
  const filtered = Boolean(filters.q || filters.category || filters.active);
  const editingComponent = editing?.mode === 'update' ? (catalog.data?.items.find((c) => c.id === editing.component.id) ?? editing.component) : null;

  return (
    <>
      <title>Catalog · Rowpath</title>
      <PageHeader
        title="Component catalog"
        description={canEdit ? 'The parts the dealership sells and fits, with prices, labour and what each asks of the tractor.' : 'The parts the dealership sells and fits. Administrators and managers keep it up to date.'}
        actions={
          canEdit && (
            <Button onClick={() => setEditing({ mode: 'create' })}>
              <span aria-hidden="true" className="text-xl leading-none">+</span> Add a component
            </Button>
          )
        }
      />
      <Notice message={notice} onDone={() => setNotice(null)} className="mb-4" />

      <form
        role="search"
        aria-label="Catalog"
        className="mb-4 flex flex-wrap items-end gap-3"
        onSubmit={(event) => {
          event.preventDefault();
          setFilters({ q: searchText.trim() || undefined, page: 1 });
        }}
      >
        <div className="min-w-60 flex-1 sm:max-w-md">
          <label htmlFor="catalog-search" className="mb-1 block font-semibold text-ink-900">
            Search the catalog
          </label>
          <input id="catalog-search" type="search" className={inputClasses} placeholder="Name, part number or maker" value={searchText} onChange={(e) => setSearchText(e.target.value)} autoComplete="off" />
        </div>
        <div className="min-w-52">
          <label htmlFor="catalog-category" className="mb-1 block font-semibold text-ink-900">
            Category
          </label>
          <select
            id="catalog-category"
            className={inputClasses}
            value={filters.category ?? ''}
            onChange={(e) => setFilters({ category: (e.target.value || undefined) as ComponentCategory | undefined, page: 1 })}
          >
            <option value="">All categories</option>
            {componentCategories.map((c) => (
              <option key={c} value={c}>
                {categoryLabels[c]}
              </option>
            ))}
          </select>
        </div>
        <div className="min-w-40">
          <label htmlFor="catalog-active" className="mb-1 block font-semibold text-ink-900">
            Status
          </label>
          <select id="catalog-active" className={inputClasses} value={filters.active ?? ''} onChange={(e) => setFilters({ active: (e.target.value || undefined) as 'true' | 'false' | undefined, page: 1 })}>
            <option value="">Active and inactive</option>
            <option value="true">Active only</option>
            <option value="false">Inactive only</option>
          </select>
        </div>
        {filtered && (
          <Button
            variant="ghost"
            onClick={() => {
              setSearchText('');
              setFilters({ q: undefined, category: undefined, active: undefined, page: 1 });
            }}
          >
            Clear filters
          </Button>
        )}
      </form>

      {catalog.isError ? (
        <ErrorState title="The catalog could not be loaded" message={catalog.error.message} onRetry={() => void catalog.refetch()} retrying={catalog.isFetching} />
      ) : (
        <TableContext value={context}>
          <DataTable
            table={table}
            caption="Component catalog"
            isLoading={catalog.isPending}
            isRefreshing={catalog.isPlaceholderData}
            empty={
              filtered ? (
                <EmptyState title="No components match these filters">Search looks at names, part numbers and makers.</EmptyState>
              ) : (
                <EmptyState title="The catalog is empty">{canEdit ? 'Add the first part with “Add a component”.' : 'Parts appear here once an administrator or manager adds them.'}</EmptyState>
              )
            }
          />
          {!catalog.isPending && total > 0 && (
            <Pagination
              page={filters.page}
              pageSize={filters.pageSize}
              total={total}
              noun={total === 1 ? 'component' : 'components'}
              pageSizes={[...catalogPageSizes]}
              onPageChange={(page) => setFilters({ page })}
              onPageSizeChange={(pageSize) => setFilters({ pageSize, page: 1 })}
            />
          )}
        </TableContext>
      )}

      <Dialog
        open={editing !== null}
        onClose={() => setEditing(null)}
        variant="panel"
        title={editingComponent ? `Edit ${editingComponent.partNumber}` : 'Add a component'}
        description={editingComponent?.name}
      >
        {editing && (
          <ComponentForm
            key={editingComponent ? `${editingComponent.id}-${editingComponent.version}` : 'new'}
            component={editingComponent}
            busy={save.isPending}
            onCancel={() => setEditing(null)}
            onReload={() => void queryClient.invalidateQueries({ queryKey: catalogKeys.all })}
            onDelete={editingComponent ? () => setDeleting(editingComponent) : undefined}
            onSubmit={(input, handleError) =>
              save.mutate(editingComponent ? { mode: 'update', id: editingComponent.id, input, version: editingComponent.version } : { mode: 'create', input }, {
                onSuccess: (saved) => {
                  setEditing(null);
                  setNotice(`${saved.partNumber} ${saved.name} was ${editingComponent ? 'saved' : 'added to the catalog'}.`);
                },
                onError: handleError,
              })
            }
          />
        )}
      </Dialog>
      <ConfirmDeleteDialog
        what={deleting ? `${deleting.partNumber} ${deleting.name}` : null}
        title={deleting ? `Delete ${deleting.partNumber} from the catalog?` : ''}
        onConfirm={() => remove.mutateAsync(deleting!.id)}
        onDeleted={() => {
          setEditing(null);
          setNotice('The component was deleted from the catalog.');
        }}
        onClose={() => setDeleting(null)}
      >
        {deleting ? `${deleting.name} will no longer be offered. A part that planters carry cannot be deleted: mark it inactive instead.` : null}
      </ConfirmDeleteDialog>
    </>
  );
}
