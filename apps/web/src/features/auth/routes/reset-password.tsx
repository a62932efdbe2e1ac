import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useNavigate, useSearchParams } from 'react-router';
import { resetPasswordForm, type ResetPasswordForm } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { TextField } from '../../../components/ui/field';
import { NarrowPage } from '../../../components/ui/layout';
import { authClient, authMessage } from '../../../lib/auth-client';

type Values = ResetPasswordForm;

export function Component() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const token = params.get('token');
  const [problem, setProblem] = useState('');
  const { register, handleSubmit, formState } = useForm<Values>({ resolver: zodResolver(resetPasswordForm) });

  const onSubmit = handleSubmit(async ({ password }) => {
    if (!token) return;
    setProblem('');
    const { error } = await authClient.resetPassword({ newPassword: password, token });
    if (error) return setProblem(authMessage(error));
    navigate('/sign-in?reset=done', { replace: true });
  });

  if (!token || params.get('error')) {
    return (
      <NarrowPage title="That link did not work">
        <Alert>This reset link has expired or was already used.</Alert>
        <p className="mt-4">
          <Link className="font-semibold text-steel underline" to="/forgot-password">
            Ask for a new link
          </Link>
        </p>
      </NarrowPage>
    );
  }
  return (
    <NarrowPage title="Choose a new password">
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <Alert>{problem}</Alert>
        <TextField label="New password" type="password" autoComplete="new-password" hint="At least 10 characters." error={formState.errors.password?.message} {...register('password')} />
        <TextField label="New password again" type="password" autoComplete="new-password" error={formState.errors.confirm?.message} {...register('confirm')} />
        <Button type="submit" busy={formState.isSubmitting} className="w-full">
          Save the new password
        </Button>
      </form>
    </NarrowPage>
  );
}
