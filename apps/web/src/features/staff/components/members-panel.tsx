import type { ColumnDef } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { assignableRoles, ROLE_LABELS, STAFF_ROLES, type MemberRow, type RinkSummary, type StaffRole } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { DataTable } from '../../../components/ui/data-table';
import { Alert, Loading } from '../../../components/ui/feedback';
import { Card } from '../../../components/ui/layout';
import { ApiError } from '../../../lib/api-client';
import { formatDate } from '../../../lib/format';
import { can } from '../../../lib/rink-context';
import { useMe } from '../../../lib/session';
import { useMembers } from '../api/get-members';
import { useRemoveMember } from '../api/remove-member';
import { useUpdateMember } from '../api/update-member';

export function MembersPanel({ rink }: { rink: RinkSummary }) {
  const members = useMembers(rink.slug);
  const update = useUpdateMember(rink.slug);
  const remove = useRemoveMember(rink.slug);
  const me = useMe();
  const [problem, setProblem] = useState('');
  const mayEdit = can(rink, 'member', 'update');
  const mayRemove = can(rink, 'member', 'delete');
  const roles = assignableRoles(rink.role);
  const myUserId = me.data?.user.id;

  const columns = useMemo<ColumnDef<MemberRow, unknown>[]>(() => {
    const report = (error: unknown) => setProblem(error instanceof ApiError ? error.message : 'That did not work. Try again.');
    // Only an owner changes an owner; the server enforces it, the screen just does not offer it.
    const editable = (m: MemberRow) => (m.role !== 'owner' || rink.role === 'owner') && roles.length > 0;
    return [
      { accessorKey: 'name', header: 'Name', cell: ({ row }) => <span className="font-semibold">{row.original.name}</span> },
      { accessorKey: 'email', header: 'E-mail' },
      {
        accessorKey: 'role',
        header: 'Role',
        cell: ({ row }) => {
          const m = row.original;
          if (!mayEdit || !editable(m)) return ROLE_LABELS[m.role];
          const options = STAFF_ROLES.filter((r) => roles.includes(r) || r === m.role);
          return (
            <select
              aria-label={`Role of ${m.name}`}
              className="min-h-11 rounded-lg border border-rule bg-white px-2"
              value={m.role}
              disabled={update.isPending}
              onChange={(e) => {
                setProblem('');
                update.mutate({ memberId: m.id, role: e.target.value as StaffRole }, { onError: report });
              }}
            >
              {options.map((r) => (
                <option key={r} value={r}>
                  {ROLE_LABELS[r]}
                </option>
              ))}
            </select>
          );
        },
      },
      { accessorKey: 'joinedAt', header: 'Joined', cell: ({ row }) => formatDate(row.original.joinedAt, rink.timeZone) },
      {
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        enableSorting: false,
        cell: ({ row }) => {
          const m = row.original;
          if (!mayRemove || !editable(m) || m.userId === myUserId) return null;
          return (
            <Button
              tone="danger"
              disabled={remove.isPending}
              onClick={() => {
                if (!window.confirm(`Remove ${m.name} from ${rink.name}? They lose access at once.`)) return;
                setProblem('');
                remove.mutate(m.id, { onError: report });
              }}
            >
              Remove
            </Button>
          );
        },
      },
    ];
  }, [mayEdit, mayRemove, roles, rink, update, remove, myUserId]);

  return (
    <Card title="Staff">
      <div className="mb-3">
        <Alert>{problem}</Alert>
      </div>
      {members.isPending ? <Loading /> : members.isError ? <Alert>{members.error.message}</Alert> : <DataTable data={members.data.members} columns={columns} caption="Staff of the rink" empty="No staff yet." />}
    </Card>
  );
}
