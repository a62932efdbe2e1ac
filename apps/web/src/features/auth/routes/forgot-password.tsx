import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router';
import { forgotPasswordForm, type ForgotPasswordForm } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { TextField } from '../../../components/ui/field';
import { NarrowPage } from '../../../components/ui/layout';
import { authClient, authMessage } from '../../../lib/auth-client';

type Values = ForgotPasswordForm;

export function Component() {
  const [sent, setSent] = useState(false);
  const [problem, setProblem] = useState('');
  const { register, handleSubmit, formState } = useForm<Values>({ resolver: zodResolver(forgotPasswordForm) });

  const onSubmit = handleSubmit(async ({ email }) => {
    setProblem('');
    const { error } = await authClient.requestPasswordReset({ email, redirectTo: '/reset-password' });
    if (error) return setProblem(authMessage(error));
    setSent(true);
  });

  return (
    <NarrowPage title="Reset your password" footer={<Link className="font-semibold text-steel underline" to="/sign-in">Back to sign-in</Link>}>
      {sent ? (
        <Alert tone="success">If an account uses that address, a reset link is on its way. It works for one hour.</Alert>
      ) : (
        <form onSubmit={onSubmit} noValidate className="space-y-4">
          <Alert>{problem}</Alert>
          <p className="text-ink-soft">Enter the e-mail of your account and we will send you a link to choose a new password.</p>
          <TextField label="E-mail" type="email" autoComplete="email" error={formState.errors.email?.message} {...register('email')} />
          <Button type="submit" busy={formState.isSubmitting} className="w-full">
            Send the reset link
          </Button>
        </form>
      )}
    </NarrowPage>
  );
}
