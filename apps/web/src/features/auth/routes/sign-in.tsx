import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useNavigate, useSearchParams } from 'react-router';
import { signInForm, type SignInForm } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { TextField } from '../../../components/ui/field';
import { NarrowPage } from '../../../components/ui/layout';
import { authClient, authMessage } from '../../../lib/auth-client';
import { homeOf, meQuery } from '../../../lib/session';

type Values = SignInForm;

/** Only same-site paths may be a return address, so a link cannot bounce a user elsewhere after sign-in. */
export function safeReturn(next: string | null): string | null {
  return next && next.startsWith('/') && !next.startsWith('//') ? next : null;
}

export function Component() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const client = useQueryClient();
  const [problem, setProblem] = useState('');
  const { register, handleSubmit, formState } = useForm<Values>({ resolver: zodResolver(signInForm), defaultValues: { email: params.get('email') ?? '' } });

  const onSubmit = handleSubmit(async (values) => {
    setProblem('');
    const { error } = await authClient.signIn.email({ email: values.email, password: values.password });
    if (error) return setProblem(authMessage(error));
    const me = await client.fetchQuery({ ...meQuery, staleTime: 0 });
    navigate(safeReturn(params.get('next')) ?? (me ? homeOf(me) : '/rinks'), { replace: true });
  });

  return (
    <NarrowPage
      title="Sign in"
      footer={
        <>
          New to Rinkwright? <Link className="font-semibold text-steel underline" to="/sign-up">Create an account</Link>
        </>
      }
    >
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <Alert>{problem}</Alert>
        {params.get('reset') === 'done' ? <Alert tone="success">Your password is changed. Sign in with the new one.</Alert> : null}
        <TextField label="E-mail" type="email" autoComplete="email" error={formState.errors.email?.message} {...register('email')} />
        <TextField label="Password" type="password" autoComplete="current-password" error={formState.errors.password?.message} {...register('password')} />
        <Button type="submit" busy={formState.isSubmitting} className="w-full">
          {formState.isSubmitting ? 'Signing in…' : 'Sign in'}
        </Button>
        <p className="text-center text-sm">
          <Link className="font-semibold text-steel underline" to="/forgot-password">
            Forgot your password?
          </Link>
        </p>
      </form>
    </NarrowPage>
  );
}
