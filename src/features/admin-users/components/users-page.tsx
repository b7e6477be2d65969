import { useQuery } from '@tanstack/react-query';
import {
  createColumnHelper,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import { createContext, use, useEffect, useMemo, useState } from 'react';
import { Button } from '@/components/ui/button';
import { DataTable } from '@/components/ui/data-table';
import { Dialog } from '@/components/ui/dialog';
import { FormAlert } from '@/components/ui/form-field';
import { PageHeader } from '@/components/ui/page-header';
import { EmptyState, ErrorState } from '@/components/ui/states';
import { StatusBadge } from '@/components/ui/status-badge';
import { roleLabels, roleShortLabels } from '@/features/auth/api/roles';
import { useCurrentUser } from '@/features/auth/components/current-user';
import { territoriesQueryOptions, type Territory } from '@/features/territories/api/territories';
import { useUpdateUserMutation } from '../api/update-user';
import { adminUsersQueryOptions, type AdminUser } from '../api/users';
import { CreateUserPanel } from './create-user-panel';
import { EditUserPanel } from './edit-user-panel';

const thisYearFormat = new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', hour: 'numeric', minute: '2-digit' });
const otherYearFormat = new Intl.DateTimeFormat('en-US', { dateStyle: 'medium' });

/** "Mar 4, 7:15 AM" this year, "Nov 28, 2025" before: short enough for the table at 1280 px. */
function formatSignIn(iso: string): string {
  const date = new Date(iso);
  return date.getFullYear() === new Date().getFullYear() ? thisYearFormat.format(date) : otherYearFormat.format(date);
}

/** Row actions and lookups the module-level columns need, without rebuilding the columns. */
interface UsersTableContext {
  meId: number;
  territoriesById: Map<number, Territory>;
  onEdit: (user: AdminUser) => void;
  onToggleDisabled: (user: AdminUser) => void;
}
const TableContext = createContext<UsersTableContext | null>(null);
function useTableContext(): UsersTableContext {
  const value = use(TableContext);
  if (!value) throw new Error('UsersPage table cells need TableContext');
  return value;
}

const column = createColumnHelper<AdminUser>();

const columns = [
  column.accessor('name', {
    header: 'Name',
    cell: (info) => <NameCell user={info.row.original} />,
  }),
  column.accessor((user) => roleShortLabels[user.role], {
    id: 'role',
    header: 'Role',
    cell: (info) => <span title={roleLabels[info.row.original.role]}>{info.getValue()}</span>,
  }),
  column.display({
    id: 'scope',
    header: 'Sees',
    cell: (info) => <ScopeCell user={info.row.original} />,
  }),
  column.accessor('disabled', {
    header: 'Status',
    cell: (info) =>
      info.getValue() ? (
        <StatusBadge tone="bad" shape="cross">
          Disabled
        </StatusBadge>
      ) : (
        <StatusBadge tone="good" shape="dot">
          Active
        </StatusBadge>
      ),
  }),
  column.accessor('lastSignInAt', {
    header: 'Last sign-in',
    sortUndefined: 'last',
    cell: (info) => {
      const value = info.getValue();
      return value ? <time dateTime={value} className="whitespace-nowrap">{formatSignIn(value)}</time> : <span className="text-loam-700">Never</span>;
    },
    meta: { className: 'hidden xl:table-cell' },
  }),
  column.display({
    id: 'actions',
    header: () => <span className="sr-only">Actions</span>,
    cell: (info) => <ActionsCell user={info.row.original} />,
    meta: { align: 'right' },
  }),
];

function NameCell({ user }: { user: AdminUser }) {
  const { meId } = useTableContext();
  return (
    <div className="min-w-48">
      <span className="font-semibold text-ink-900">{user.name}</span>
      {user.id === meId && <span className="ml-2 rounded bg-ink-100 px-1.5 py-0.5 text-xs font-semibold text-ink-800">You</span>}
      <span className="block text-sm [overflow-wrap:anywhere] text-loam-700">{user.email}</span>
    </div>
  );
}

function ScopeCell({ user }: { user: AdminUser }) {
  const { territoriesById } = useTableContext();
  if (user.role === 'admin') return <span>Everything</span>;
  if (user.role === 'grower')
    return user.accountId ? <span className="whitespace-nowrap">Account #{user.accountId}</span> : <span className="text-loam-700">No account linked</span>;
  if (user.territoryIds.length === 0) return <span className="text-loam-700">No territory</span>;
  const names = user.territoryIds.map((id) => territoriesById.get(id)?.name ?? `Territory #${id}`);
  const shown = names.slice(0, 2).join(', ');
  return (
    <span title={names.join(', ')}>
      {shown}
      {names.length > 2 && <span className="text-loam-700"> and {names.length - 2} more</span>}
    </span>
  );
}

function ActionsCell({ user }: { user: AdminUser }) {
  const { meId, onEdit, onToggleDisabled } = useTableContext();
  // Edit stays last so it lines up in every row, including yours (which has no Disable).
  return (
    <div className="flex justify-end gap-2">
      {user.id !== meId && (
        <Button variant="ghost" className="px-3" onClick={() => onToggleDisabled(user)}>
          {user.disabled ? 'Enable' : 'Disable'}
          <span className="sr-only"> {user.name}</span>
        </Button>
      )}
      <Button variant="secondary" className="px-3" onClick={() => onEdit(user)}>
        Edit<span className="sr-only"> {user.name}</span>
      </Button>
    </div>
  );
}

export function UsersPage() {
  const me = useCurrentUser();
  const users = useQuery(adminUsersQueryOptions());
  const territories = useQuery(territoriesQueryOptions());
  const [sorting, setSorting] = useState<SortingState>([{ id: 'name', desc: false }]);
  const [creating, setCreating] = useState(false);
  const [editing, setEditing] = useState<AdminUser | null>(null);
  const [confirming, setConfirming] = useState<AdminUser | null>(null);
  const [notice, setNotice] = useState<string | null>(null);

  // A confirmation line that clears itself; it is also announced (role=status).
  useEffect(() => {
    if (!notice) return;
    const timer = window.setTimeout(() => setNotice(null), 8000);
    return () => window.clearTimeout(timer);
  }, [notice]);

  const territoriesById = useMemo(() => new Map((territories.data ?? []).map((t) => [t.id, t])), [territories.data]);
  const context = useMemo<UsersTableContext>(
    () => ({ meId: me.id, territoriesById, onEdit: setEditing, onToggleDisabled: setConfirming }),
    [me.id, territoriesById],
  );

  const table = useReactTable({
    data: users.data ?? [],
    columns,
    getRowId: (row) => String(row.id),
    state: { sorting },
    onSortingChange: setSorting,
    enableSortingRemoval: false,
    getCoreRowModel: getCoreRowModel(),
    // The whole list comes in one answer (a dealership has tens of users), so sort here.
    getSortedRowModel: getSortedRowModel(),
  });

  return (
    <>
      <title>Users · Rowpath</title>
      <PageHeader
        title="Users"
        description="Who can sign in, in which role, and what each one sees."
        actions={
          <Button onClick={() => setCreating(true)}>
            <span aria-hidden="true" className="text-xl leading-none">+</span> Add a user
          </Button>
        }
      />

      <div role="status" className="empty:hidden mb-4">
        {notice && <p className="rounded-lg border-l-4 border-seedling-500 bg-seedling-50 px-4 py-3 font-semibold text-seedling-800"><span aria-hidden="true">✓ </span>{notice}</p>}
      </div>

      {users.isError ? (
        <ErrorState title="Users could not be loaded" message={users.error.message} onRetry={() => void users.refetch()} retrying={users.isFetching} />
      ) : (
        <TableContext value={context}>
          <DataTable
            table={table}
            caption="Users"
            isLoading={users.isPending}
            skeletonRows={5}
            empty={<EmptyState title="No users yet">Add the first user with “Add a user”.</EmptyState>}
          />
        </TableContext>
      )}

      <CreateUserPanel
        open={creating}
        onClose={() => setCreating(false)}
        onCreated={(user) => {
          setCreating(false);
          setNotice(`${user.name} was added as ${roleLabels[user.role].toLowerCase()}.`);
        }}
      />
      <EditUserPanel
        user={editing}
        isSelf={editing?.id === me.id}
        onClose={() => setEditing(null)}
        onSaved={(user) => {
          setEditing(null);
          setNotice(`Changes to ${user.name} were saved.`);
        }}
      />
      <ConfirmDisableDialog
        user={confirming}
        onClose={() => setConfirming(null)}
        onDone={(user) => {
          setConfirming(null);
          setNotice(user.disabled ? `${user.name} was disabled and signed out.` : `${user.name} can sign in again.`);
        }}
      />
    </>
  );
}

/** Disabling ends that user's sessions at once, so it asks first. */
function ConfirmDisableDialog({ user, onClose, onDone }: { user: AdminUser | null; onClose: () => void; onDone: (user: AdminUser) => void }) {
  const disabling = user ? !user.disabled : true;
  return (
    <Dialog open={user !== null} onClose={onClose} title={user ? `${disabling ? 'Disable' : 'Enable'} ${user.name}?` : ''}>
      {/* Keyed by user: a new choice starts without the last attempt's error. */}
      {user && <ConfirmDisableBody key={user.id} user={user} onClose={onClose} onDone={onDone} />}
    </Dialog>
  );
}

function ConfirmDisableBody({ user, onClose, onDone }: { user: AdminUser; onClose: () => void; onDone: (user: AdminUser) => void }) {
  const updateUser = useUpdateUserMutation();
  const disabling = !user.disabled;
  return (
    <div className="space-y-4">
      <p>
        {disabling
          ? `${user.name} will be signed out everywhere at once and cannot sign in until an administrator enables the account again. Their records stay as they are.`
          : `${user.name} will be able to sign in again with their current password.`}
      </p>
      {updateUser.isError && <FormAlert>{updateUser.error.message}</FormAlert>}
      <div className="flex flex-wrap gap-3 pt-2">
        <Button
          variant={disabling ? 'danger' : 'primary'}
          busy={updateUser.isPending}
          onClick={() => updateUser.mutate({ id: user.id, changes: { disabled: disabling } }, { onSuccess: ({ user: saved }) => onDone(saved) })}
        >
          {disabling ? 'Disable user' : 'Enable user'}
        </Button>
        <Button variant="secondary" onClick={onClose} data-autofocus>
          Cancel
        </Button>
      </div>
    </div>
  );
}
