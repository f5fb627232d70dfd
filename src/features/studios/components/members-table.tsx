import { useMemo, useState } from 'react';
import { createColumnHelper } from '@tanstack/react-table';
import { STUDIO_ROLES, type StudioRole } from '../../../../shared/api/roles.js';
import type { Member } from '../../../../shared/api/studios.js';
import { Button } from '../../../components/ui/button.js';
import { DataTable } from '../../../components/ui/data-table.js';
import { describeError } from '../../../components/ui/error-state.js';
import { InlineSelect } from '../../../components/ui/field.js';
import { FormStatus, type FormStatusValue } from '../../../components/ui/form-status.js';
import { ROLE_LABELS, RoleBadge } from '../../../components/ui/role-badge.js';
import { formatDate } from '../../../lib/format.js';
import { useRemoveMember } from '../api/remove-member.js';
import { useUpdateMember } from '../api/update-member.js';
import { EmailText, PersonName } from '../../../components/ui/person-cells.js';

const column = createColumnHelper<Member>();
const roleOrder = (role: StudioRole) => STUDIO_ROLES.indexOf(role);

function RemoveControl({
  member,
  pending,
  onRemove,
}: {
  member: Member;
  pending: boolean;
  onRemove: () => void;
}) {
  const [confirming, setConfirming] = useState(false);
  if (!confirming) {
    return (
      <Button variant="quiet" size="sm" onClick={() => setConfirming(true)} aria-label={`Remove ${member.name}`}>
        Remove
      </Button>
    );
  }
  return (
    <span className="inline-flex items-center gap-2">
      <Button variant="danger" size="sm" pending={pending} pendingLabel="Removing…" onClick={onRemove} autoFocus>
        Yes, remove {member.name}
      </Button>
      <Button variant="quiet" size="sm" onClick={() => setConfirming(false)}>
        Keep
      </Button>
    </span>
  );
}

export function MembersTable({
  studioId,
  members,
  canManage,
  currentUserId,
}: {
  studioId: number;
  members: Member[];
  canManage: boolean;
  currentUserId: number;
}) {
  const [status, setStatus] = useState<FormStatusValue>(null);
  const updateMember = useUpdateMember(studioId);
  const removeMember = useRemoveMember(studioId);
  const pendingRoleFor = updateMember.isPending ? updateMember.variables?.userId : undefined;
  const pendingRemoveFor = removeMember.isPending ? removeMember.variables : undefined;

  const columns = useMemo(() => {
    const base = [
      column.accessor('name', {
        header: 'Name',
        cell: (info) => <PersonName name={info.getValue()} isYou={info.row.original.userId === currentUserId} />,
      }),
      column.accessor('email', {
        header: 'E-mail',
        cell: (info) => <EmailText email={info.getValue()} />,
      }),
      column.accessor('role', {
        header: 'Role',
        sortingFn: (a, b) => roleOrder(a.original.role) - roleOrder(b.original.role),
        cell: (info) => {
          const member = info.row.original;
          if (!canManage) return <RoleBadge role={member.role} />;
          return (
            <span className="inline-flex items-center gap-2">
              <RoleBadge role={member.role} />
              <InlineSelect
                aria-label={`Role of ${member.name}`}
                value={member.role}
                disabled={pendingRoleFor === member.userId}
                onChange={(e) => {
                  const role = e.target.value as StudioRole;
                  setStatus(null);
                  updateMember.mutate(
                    { userId: member.userId, role },
                    {
                      onSuccess: () =>
                        setStatus({ kind: 'success', message: `${member.name} is now ${ROLE_LABELS[role].toLowerCase()}.` }),
                      onError: (error) =>
                        setStatus({ kind: 'error', message: `${member.name}'s role was not changed: ${describeError(error)}` }),
                    },
                  );
                }}
              >
                {STUDIO_ROLES.map((r) => (
                  <option key={r} value={r}>
                    {ROLE_LABELS[r]}
                  </option>
                ))}
              </InlineSelect>
            </span>
          );
        },
      }),
      column.accessor('joinedAt', {
        header: 'Joined',
        enableGlobalFilter: false,
        cell: (info) => <span className="whitespace-nowrap font-mono text-xs">{formatDate(info.getValue())}</span>,
      }),
    ];
    if (!canManage) return base;
    return [
      ...base,
      column.display({
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        cell: (info) => {
          const member = info.row.original;
          return (
            <RemoveControl
              member={member}
              pending={pendingRemoveFor === member.userId}
              onRemove={() => {
                setStatus(null);
                removeMember.mutate(member.userId, {
                  onSuccess: () => setStatus({ kind: 'success', message: `${member.name} was removed from the studio.` }),
                  onError: (error) =>
                    setStatus({ kind: 'error', message: `${member.name} was not removed: ${describeError(error)}` }),
                });
              }}
            />
          );
        },
      }),
    ];
  }, [canManage, currentUserId, pendingRoleFor, pendingRemoveFor, updateMember, removeMember]);

  return (
    <div className="space-y-3">
      <DataTable
        data={members}
        columns={columns}
        caption="Studio members"
        filterLabel="Filter members"
        filterPlaceholder="Name, e-mail or role"
        initialSorting={[{ id: 'role', desc: false }]}
        getRowId={(m) => String(m.userId)}
        emptyMessage="No members yet."
      />
      <FormStatus status={status} />
    </div>
  );
}
