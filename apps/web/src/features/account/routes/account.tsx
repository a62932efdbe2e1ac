import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router';
import { changePasswordForm, profileForm, type ChangePasswordForm, type ProfileForm } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { TextField } from '../../../components/ui/field';
import { Card, PageHeader } from '../../../components/ui/layout';
import { authClient, authMessage } from '../../../lib/auth-client';
import { meKey, useMe } from '../../../lib/session';

type Note = { tone: 'error' | 'success'; text: string } | null;

function ProfileCard({ name, email }: { name: string; email: string }) {
  const client = useQueryClient();
  const [note, setNote] = useState<Note>(null);
  const { register, handleSubmit, formState } = useForm<ProfileForm>({ resolver: zodResolver(profileForm), values: { name } });
  const onSubmit = handleSubmit(async (values) => {
    const { error } = await authClient.updateUser({ name: values.name });
    setNote(error ? { tone: 'error', text: authMessage(error) } : { tone: 'success', text: 'Name saved.' });
    if (!error) await client.invalidateQueries({ queryKey: meKey });
  });
  return (
    <Card title="Profile">
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
        <TextField label="Name" autoComplete="name" error={formState.errors.name?.message} {...register('name')} />
        <TextField label="E-mail" value={email} readOnly disabled hint="Your sign-in address." />
        <Button type="submit" busy={formState.isSubmitting} disabled={!formState.isDirty}>
          Save name
        </Button>
      </form>
    </Card>
  );
}

function PasswordCard() {
  const [note, setNote] = useState<Note>(null);
  const { register, handleSubmit, formState, reset } = useForm<ChangePasswordForm>({ resolver: zodResolver(changePasswordForm) });
  const onSubmit = handleSubmit(async (values) => {
    const { error } = await authClient.changePassword({ currentPassword: values.currentPassword, newPassword: values.newPassword, revokeOtherSessions: true });
    if (error) return setNote({ tone: 'error', text: error.code === 'INVALID_PASSWORD' ? 'The current password is not right.' : authMessage(error) });
    reset({ currentPassword: '', newPassword: '', confirm: '' });
    setNote({ tone: 'success', text: 'Password changed. Other devices were signed out.' });
  });
  return (
    <Card title="Password">
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
        <TextField label="Current password" type="password" autoComplete="current-password" error={formState.errors.currentPassword?.message} {...register('currentPassword')} />
        <TextField label="New password" type="password" autoComplete="new-password" hint="At least 10 characters." error={formState.errors.newPassword?.message} {...register('newPassword')} />
        <TextField label="New password again" type="password" autoComplete="new-password" error={formState.errors.confirm?.message} {...register('confirm')} />
        <Button type="submit" busy={formState.isSubmitting}>
          Change password
        </Button>
      </form>
    </Card>
  );
}

export function Component() {
  const { data: me } = useMe();
  const client = useQueryClient();
  const navigate = useNavigate();
  if (!me) return null;
  return (
    <div className="mx-auto max-w-3xl space-y-6 px-4 py-8">
      <PageHeader
        title="Your account"
        actions={
          <Button
            tone="secondary"
            onClick={async () => {
              await authClient.signOut();
              client.clear();
              navigate('/', { replace: true });
            }}
          >
            Sign out
          </Button>
        }
      />
      <ProfileCard name={me.user.name} email={me.user.email} />
      <PasswordCard />
    </div>
  );
}
