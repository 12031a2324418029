import { useMemo, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { toast } from '@/lib/toast';
import { ROLE_DESCRIPTIONS, ROLE_LABELS, ROLES, type Role } from '@shared/constants';
import type { AdminUser, User } from '@shared/schemas/user';
import { Button } from '@/components/ui/button';
import { Chip, Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { Dialog } from '@/components/ui/dialog';
import { TextAreaField } from '@/components/ui/field';
import { ApiError } from '@/lib/api-client';
import { useDebouncedValue } from '@/lib/use-debounced-value';
import { adminUserQueries, useUpdateUser } from '../api/users';

const col = createColumnHelper<AdminUser>();
const PAGE_SIZE = 25;

export function UsersTable({ me }: { me: User }) {
  const [search, setSearch] = useState('');
  const [page, setPage] = useState(1);
  const q = useDebouncedValue(search.trim(), 250);
  const list = useQuery(adminUserQueries.list({ q: q || undefined, page, pageSize: PAGE_SIZE }));
  const update = useUpdateUser();

  // A role change or a disabling waits here for its reason; enabling again happens at once.
  const [pending, setPending] = useState<{ user: AdminUser; role?: Role; disabled?: boolean } | null>(null);
  const [reason, setReason] = useState('');
  const [reasonError, setReasonError] = useState<string>();

  const ask = (user: AdminUser, patch: { role?: Role; disabled?: boolean }) => {
    setReason('');
    setReasonError(undefined);
    setPending({ user, ...patch });
  };

  const apply = async (user: AdminUser, patch: { role?: Role; disabled?: boolean; reason?: string }) => {
    try {
      await update.mutateAsync({ id: user.id, ...patch });
      toast.success(
        patch.role
          ? `${user.displayName} is now ${ROLE_LABELS[patch.role].toLowerCase()}`
          : patch.disabled
            ? `${user.displayName} is disabled and signed out`
            : `${user.displayName} is enabled`,
      );
      return true;
    } catch (err) {
      if (err instanceof ApiError && err.fieldErrors.reason) setReasonError(err.fieldErrors.reason);
      else toast.error((err as Error).message);
      return false;
    }
  };

  const handleConfirm = async () => {
    if (!pending) return;
    if (reason.trim().length < 5) {
      setReasonError('Give a reason (at least 5 characters): it is kept in the audit log.');
      return;
    }
    const { user, ...patch } = pending;
    if (await apply(user, { ...patch, reason: reason.trim() })) setPending(null);
  };

  const columns = useMemo(
    () => [
      col.accessor('displayName', { header: 'Name', cell: (c) => <span className="font-medium">{c.getValue()}</span> }),
      col.accessor('email', { header: 'E-mail' }),
      col.accessor('role', {
        header: 'Role',
        cell: (c) => {
          const u = c.row.original;
          return (
            <select
              aria-label={`Role of ${u.displayName}`}
              className="rounded border border-ink/25 bg-white/80 px-2 py-1 text-sm"
              value={u.role}
              disabled={u.id === me.id || update.isPending}
              onChange={(e) => ask(u, { role: e.target.value as Role })}
            >
              {ROLES.map((r) => (
                <option key={r} value={r}>
                  {ROLE_LABELS[r]}
                </option>
              ))}
            </select>
          );
        },
      }),
      col.accessor('emailVerified', { header: 'Confirmed', cell: (c) => (c.getValue() ? 'yes' : <Chip>pending</Chip>) }),
      col.accessor('disabled', {
        header: 'Status',
        cell: (c) => {
          const u = c.row.original;
          return (
            <div className="flex items-center gap-2">
              {u.disabled ? <Chip tone="ink">disabled</Chip> : <Chip>active</Chip>}
              {u.id !== me.id && (
                <Button
                  size="sm"
                  variant="secondary"
                  className={u.disabled ? '' : 'text-danger!'}
                  onClick={() => (u.disabled ? apply(u, { disabled: false }) : ask(u, { disabled: true }))}
                  disabled={update.isPending}
                >
                  {u.disabled ? 'Enable' : 'Disable'}
                </Button>
              )}
            </div>
          );
        },
      }),
    ],
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [me.id, update.isPending],
  );

  const table = useReactTable({ data: list.data?.data ?? [], columns, getCoreRowModel: getCoreRowModel() });
  const total = list.data?.meta.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-center gap-3">
        <label className="flex items-center gap-2 text-sm">
          <span className="font-medium">Search</span>
          <input
            type="search"
            value={search}
            onChange={(e) => {
              setSearch(e.target.value);
              setPage(1);
            }}
            placeholder="e-mail or name"
            className="w-64 rounded-md border border-ink/25 bg-white/80 px-3 py-1.5"
          />
        </label>
        <span className="text-sm text-ink-muted">
          {total} account{total === 1 ? '' : 's'}
        </span>
      </div>
      {list.isError && <Notice tone="danger">{list.error.message}</Notice>}
      {list.isPending ? (
        <Spinner />
      ) : (
        <div className="table-scroll rounded-lg border border-paper-line bg-paper-card">
          <table className="w-full text-left text-sm">
            <thead className="bg-paper-deep">
              {table.getHeaderGroups().map((hg) => (
                <tr key={hg.id}>
                  {hg.headers.map((h) => (
                    <th key={h.id} scope="col" className="px-3 py-2 font-semibold">
                      {flexRender(h.column.columnDef.header, h.getContext())}
                    </th>
                  ))}
                </tr>
              ))}
            </thead>
            <tbody>
              {table.getRowModel().rows.map((row) => (
                <tr key={row.id} className="border-t border-paper-line">
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className="px-3 py-2 align-middle">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              ))}
              {table.getRowModel().rows.length === 0 && (
                <tr>
                  <td colSpan={5} className="px-3 py-6 text-center text-ink-muted">
                    No account matches “{q}”.
                  </td>
                </tr>
              )}
            </tbody>
          </table>
        </div>
      )}
      <Dialog
        open={!!pending}
        onClose={() => setPending(null)}
        title={pending?.role ? `Change the role of ${pending.user.displayName}?` : `Disable ${pending?.user.displayName ?? ''}?`}
        footer={
          <>
            <Button variant="secondary" onClick={() => setPending(null)}>
              Cancel
            </Button>
            <Button variant={pending?.role ? 'primary' : 'danger'} onClick={handleConfirm} pending={update.isPending}>
              {pending?.role ? `Make ${ROLE_LABELS[pending.role].toLowerCase()}` : 'Disable account'}
            </Button>
          </>
        }
      >
        {pending && (
          <div className="flex flex-col gap-3 text-sm">
            {pending.role ? (
              <p className="text-ink-soft">
                From <strong>{ROLE_LABELS[pending.user.role]}</strong> to <strong>{ROLE_LABELS[pending.role]}</strong>:{' '}
                {ROLE_LABELS[pending.role].toLowerCase()}s {ROLE_DESCRIPTIONS[pending.role]}.
              </p>
            ) : (
              <p className="text-ink-soft">
                They are signed out everywhere at once and cannot sign in until an administrator enables the account again. Their published work stays.
              </p>
            )}
            <TextAreaField
              label="Reason"
              hint="Kept in the audit log, where moderators and administrators read it."
              rows={3}
              maxLength={500}
              value={reason}
              onChange={(e) => {
                setReason(e.target.value);
                setReasonError(undefined);
              }}
              error={reasonError}
              required
            />
          </div>
        )}
      </Dialog>
      {pages > 1 && (
        <div className="flex items-center gap-3 text-sm">
          <Button size="sm" variant="secondary" disabled={page <= 1} onClick={() => setPage((p) => p - 1)}>
            Previous
          </Button>
          <span>
            Page {page} of {pages}
          </span>
          <Button size="sm" variant="secondary" disabled={page >= pages} onClick={() => setPage((p) => p + 1)}>
            Next
          </Button>
        </div>
      )}
    </div>
  );
}
