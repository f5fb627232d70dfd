import { useMemo, useState } from 'react';
import { createColumnHelper } from '@tanstack/react-table';
import type { AdminUser } from '../../../../shared/api/admin.js';
import { GLOBAL_ROLES, type GlobalRole } from '../../../../shared/api/roles.js';
import { DataTable } from '../../../components/ui/data-table.js';
import { describeError } from '../../../components/ui/error-state.js';
import { InlineSelect } from '../../../components/ui/field.js';
import { FormStatus, type FormStatusValue } from '../../../components/ui/form-status.js';
import { ROLE_LABELS, RoleBadge } from '../../../components/ui/role-badge.js';
import { formatDate, formatDateTime } from '../../../lib/format.js';
import { useUpdateUser } from '../api/update-user.js';
import { EmailText, PersonName } from '../../../components/ui/person-cells.js';

const column = createColumnHelper<AdminUser>();
const NONE = '';

export function UsersTable({ users, currentUserId }: { users: AdminUser[]; currentUserId: number }) {
  const [status, setStatus] = useState<FormStatusValue>(null);
  const updateUser = useUpdateUser();
  const pendingFor = updateUser.isPending ? updateUser.variables?.userId : undefined;

  const columns = useMemo(
    () => [
      column.accessor('name', {
        header: 'Name',
        cell: (info) => <PersonName name={info.getValue()} isYou={info.row.original.id === currentUserId} />,
      }),
      column.accessor('email', {
        header: 'E-mail',
        cell: (info) => <EmailText email={info.getValue()} />,
      }),
      column.accessor((u) => u.globalRole ?? '', {
        id: 'globalRole',
        header: 'Global role',
        cell: (info) => {
          const user = info.row.original;
          return (
            <span className="inline-flex items-center gap-2">
              {user.globalRole ? <RoleBadge role={user.globalRole} /> : null}
              <InlineSelect
                aria-label={`Global role of ${user.name}`}
                value={user.globalRole ?? NONE}
                disabled={pendingFor === user.id}
                onChange={(e) => {
                  const globalRole = (e.target.value || null) as GlobalRole | null;
                  setStatus(null);
                  updateUser.mutate(
                    { userId: user.id, globalRole },
                    {
                      onSuccess: () =>
                        setStatus({
                          kind: 'success',
                          message: globalRole
                            ? `${user.name} is now ${ROLE_LABELS[globalRole].toLowerCase()}.`
                            : `${user.name} no longer holds a global role.`,
                        }),
                      onError: (error) =>
                        setStatus({ kind: 'error', message: `${user.name}'s global role was not changed: ${describeError(error)}` }),
                    },
                  );
                }}
              >
                <option value={NONE}>No global role</option>
                {GLOBAL_ROLES.map((r) => (
                  <option key={r} value={r}>
                    {ROLE_LABELS[r]}
                  </option>
                ))}
              </InlineSelect>
            </span>
          );
        },
      }),
      column.accessor((u) => u.memberships.map((m) => `${m.studioName} ${m.role}`).join(' '), {
        id: 'memberships',
        header: 'Studios',
        enableSorting: false,
        cell: (info) => {
          const memberships = info.row.original.memberships;
          if (memberships.length === 0) return <span className="text-ink-soft">None</span>;
          return (
            <ul className="space-y-1">
              {memberships.map((m) => (
                <li key={m.studioId} className="flex flex-wrap items-center gap-2">
                  <span>{m.studioName}</span>
                  <RoleBadge role={m.role} />
                </li>
              ))}
            </ul>
          );
        },
      }),
      column.accessor((u) => u.lastLoginAt ?? '', {
        id: 'lastLoginAt',
        header: 'Last sign-in',
        enableGlobalFilter: false,
        cell: (info) => <span className="whitespace-nowrap font-mono text-xs">{info.row.original.lastLoginAt ? formatDateTime(info.row.original.lastLoginAt) : 'never'}</span>,
      }),
      column.accessor('createdAt', {
        header: 'Created',
        enableGlobalFilter: false,
        cell: (info) => <span className="whitespace-nowrap font-mono text-xs">{formatDate(info.getValue())}</span>,
      }),
    ],
    [currentUserId, pendingFor, updateUser],
  );

  return (
    <div className="space-y-3">
      <DataTable
        data={users}
        columns={columns}
        caption="Users"
        filterLabel="Filter users"
        filterPlaceholder="Name, e-mail, role or studio"
        initialSorting={[{ id: 'name', desc: false }]}
        getRowId={(u) => String(u.id)}
        emptyMessage="No users yet."
      />
      <FormStatus status={status} />
    </div>
  );
}
