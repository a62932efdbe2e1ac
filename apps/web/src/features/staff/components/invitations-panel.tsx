import { zodResolver } from '@hookform/resolvers/zod';
import type { ColumnDef } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { useForm } from 'react-hook-form';
import { assignableRoles, inviteInput, ROLE_LABELS, type InvitationRow, type InviteInput, type RinkSummary } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { DataTable } from '../../../components/ui/data-table';
import { Alert, Loading } from '../../../components/ui/feedback';
import { SelectField, TextField } from '../../../components/ui/field';
import { Card } from '../../../components/ui/layout';
import { ApiError } from '../../../lib/api-client';
import { formatDateTime } from '../../../lib/format';
import { applyServerErrors } from '../../../lib/forms';
import { can } from '../../../lib/rink-context';
import { useCreateInvitation } from '../api/create-invitation';
import { useInvitations } from '../api/get-invitations';
import { useRevokeInvitation } from '../api/revoke-invitation';

export function InvitationsPanel({ rink }: { rink: RinkSummary }) {
  const invitations = useInvitations(rink.slug, can(rink, 'invitation', 'read'));
  const create = useCreateInvitation(rink.slug);
  const revoke = useRevokeInvitation(rink.slug);
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const roles = assignableRoles(rink.role);
  const { register, handleSubmit, formState, setError, reset } = useForm<InviteInput>({
    resolver: zodResolver(inviteInput),
    defaultValues: { email: '', role: 'technician' },
  });

  const onSubmit = handleSubmit(async (values) => {
    setNote(null);
    try {
      await create.mutateAsync(values);
      reset({ email: '', role: values.role });
      setNote({ tone: 'success', text: `Invitation sent to ${values.email}.` });
    } catch (error) {
      setNote({ tone: 'error', text: applyServerErrors(error, setError, ['email', 'role']) });
    }
  });

  const columns = useMemo<ColumnDef<InvitationRow, unknown>[]>(
    () => [
      { accessorKey: 'email', header: 'E-mail', cell: ({ row }) => <span className="font-semibold">{row.original.email}</span> },
      { accessorKey: 'role', header: 'Role', cell: ({ row }) => ROLE_LABELS[row.original.role] },
      { accessorKey: 'invitedBy', header: 'Invited by' },
      { accessorKey: 'expiresAt', header: 'Expires', cell: ({ row }) => formatDateTime(row.original.expiresAt, rink.timeZone) },
      {
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        enableSorting: false,
        cell: ({ row }) =>
          can(rink, 'invitation', 'cancel') ? (
            <Button
              tone="danger"
              disabled={revoke.isPending}
              onClick={() =>
                revoke.mutate(row.original.id, {
                  onSuccess: () => setNote({ tone: 'success', text: `Invitation to ${row.original.email} revoked.` }),
                  onError: (e) => setNote({ tone: 'error', text: e instanceof ApiError ? e.message : 'That did not work.' }),
                })
              }
            >
              Revoke
            </Button>
          ) : null,
      },
    ],
    [rink, revoke],
  );

  if (!can(rink, 'invitation', 'read')) return null;
  return (
    <Card title="Invitations">
      {can(rink, 'invitation', 'create') ? (
        <form onSubmit={onSubmit} noValidate className="mb-6 grid gap-4 sm:grid-cols-[1fr_14rem_auto] sm:items-start">
          <TextField label="E-mail to invite" type="email" autoComplete="off" error={formState.errors.email?.message} {...register('email')} />
          <SelectField label="Role" options={roles.map((r) => ({ value: r, label: ROLE_LABELS[r] }))} error={formState.errors.role?.message} {...register('role')} />
          <Button type="submit" busy={formState.isSubmitting} className="sm:mt-6">
            {formState.isSubmitting ? 'Sending…' : 'Send invitation'}
          </Button>
        </form>
      ) : null}
      {note ? (
        <div className="mb-3">
          <Alert tone={note.tone}>{note.text}</Alert>
        </div>
      ) : null}
      <h3 className="mb-2 font-bold">Pending</h3>
      {invitations.isPending ? (
        <Loading />
      ) : invitations.isError ? (
        <Alert>{invitations.error.message}</Alert>
      ) : (
        <DataTable data={invitations.data.invitations} columns={columns} caption="Pending invitations" empty="No pending invitations." />
      )}
    </Card>
  );
}
