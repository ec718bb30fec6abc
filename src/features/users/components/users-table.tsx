import { useMemo, useState } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import { ROLES, ROLE_LABELS, type Role } from '../../../../shared/api/roles.ts';
import type { UserRow } from '../../../../shared/api/users.ts';
import { Button } from '../../../components/ui/button.tsx';
import { ConfirmDialog } from '../../../components/ui/confirm-dialog.tsx';
import { DataTable, type ServerSort } from '../../../components/ui/data-table.tsx';
import { Notice, StatusTag } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useUsers } from '../api/get-users.ts';
import { useUpdateUser } from '../api/update-user.ts';

const PAGE_SIZE = 20;

export function UsersTable({ currentUserId }: { currentUserId: number }) {
  const [page, setPage] = useState(1);
  const [sort, setSort] = useState<ServerSort | null>({ id: 'name', desc: false });
  const [search, setSearch] = useState('');
  const [role, setRole] = useState<Role | ''>('');
  const [pending, setPending] = useState<{ user: UserRow; change: { role?: Role; active?: boolean } } | null>(null);
  const update = useUpdateUser();
  const q = useUsers({ page, pageSize: PAGE_SIZE, search, role, sort: sort?.id, dir: sort?.desc ? 'desc' : 'asc' });

  const columns = useMemo<ColumnDef<UserRow, unknown>[]>(
    () => [
      { id: 'name', accessorKey: 'name', header: 'Name', enableSorting: true },
      { id: 'email', accessorKey: 'email', header: 'E-mail', enableSorting: true },
      {
        id: 'role',
        accessorKey: 'role',
        header: 'Role',
        enableSorting: true,
        cell: ({ row }) => (
          <select
            aria-label={`Role of ${row.original.name}`}
            value={row.original.role}
            disabled={row.original.id === currentUserId || !row.original.active}
            onChange={(e) => setPending({ user: row.original, change: { role: e.target.value as Role } })}
            className="rounded border border-rule bg-panel px-1.5 py-0.5 text-sm disabled:opacity-60"
          >
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r]}
              </option>
            ))}
          </select>
        ),
      },
      {
        id: 'status',
        header: 'Status',
        enableSorting: false,
        cell: ({ row }) => (row.original.active ? <StatusTag tone="pass">Active</StatusTag> : <StatusTag tone="neutral">Deactivated</StatusTag>),
      },
      {
        id: 'createdAt',
        accessorKey: 'createdAt',
        header: 'Added',
        enableSorting: true,
        cell: ({ row }) => <span className="num">{new Date(row.original.createdAt).toLocaleDateString()}</span>,
      },
      {
        id: 'actions',
        header: '',
        enableSorting: false,
        cell: ({ row }) =>
          row.original.id === currentUserId ? (
            <span className="text-xs text-ink-faint">you</span>
          ) : (
            <Button
              variant="quiet"
              onClick={() => setPending({ user: row.original, change: { active: !row.original.active } })}
            >
              {row.original.active ? 'Deactivate' : 'Reactivate'}
            </Button>
          ),
      },
    ],
    [currentUserId],
  );

  const err = update.error instanceof ApiError ? update.error : null;

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink-soft">
          Search
          <input
            type="search"
            value={search}
            onChange={(e) => {
              setSearch(e.target.value);
              setPage(1);
            }}
            placeholder="Name or e-mail"
            className="w-64 rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink"
          />
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink-soft">
          Role
          <select
            value={role}
            onChange={(e) => {
              setRole(e.target.value as Role | '');
              setPage(1);
            }}
            className="rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink"
          >
            <option value="">All roles</option>
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r]}
              </option>
            ))}
          </select>
        </label>
      </div>
      {err && <Notice tone="fail">{err.problem.detail}</Notice>}
      {q.isError ? (
        <Notice tone="fail" title="Users could not be loaded">{(q.error as Error).message}</Notice>
      ) : (
        <DataTable
          caption="Users"
          columns={columns}
          rows={q.data?.items ?? []}
          total={q.data?.total ?? 0}
          page={page}
          pageSize={PAGE_SIZE}
          sort={sort}
          onSortChange={(s) => {
            setSort(s);
            setPage(1);
          }}
          onPageChange={setPage}
          loading={q.isLoading}
          getRowId={(u) => String(u.id)}
          empty={search || role ? 'No user matches these filters.' : 'No users yet.'}
        />
      )}
      <ConfirmDialog
        open={pending !== null}
        title={
          pending?.change.active === false
            ? `Deactivate ${pending.user.name}?`
            : pending?.change.active === true
              ? `Reactivate ${pending.user.name}?`
              : `Change ${pending?.user.name}'s role?`
        }
        confirmLabel={pending?.change.active === false ? 'Deactivate' : 'Confirm'}
        tone={pending?.change.active === false ? 'danger' : 'primary'}
        busy={update.isPending}
        onCancel={() => setPending(null)}
        onConfirm={() => {
          if (!pending) return;
          update.mutate({ id: pending.user.id, ...pending.change }, { onSettled: () => setPending(null) });
        }}
      >
        {pending?.change.active === false
          ? 'They will be signed out and can no longer sign in. Their name stays in the audit trail; you can reactivate them later.'
          : pending?.change.role
            ? `From ${ROLE_LABELS[pending.user.role]} to ${ROLE_LABELS[pending.change.role]}. This changes what they can see and do from their next request.`
            : 'They will be able to sign in again with their existing password.'}
      </ConfirmDialog>
    </div>
  );
}
