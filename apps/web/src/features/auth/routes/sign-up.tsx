import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useNavigate, useSearchParams } from 'react-router';
import { signUpForm, type SignUpForm } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { TextField } from '../../../components/ui/field';
import { NarrowPage } from '../../../components/ui/layout';
import { authClient, authMessage } from '../../../lib/auth-client';
import { safeReturn } from './sign-in';

type Values = SignUpForm;

export function Component() {
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const [problem, setProblem] = useState('');
  const { register, handleSubmit, formState } = useForm<Values>({
    resolver: zodResolver(signUpForm),
    defaultValues: { email: params.get('email') ?? '', name: '', password: '' },
  });

  const onSubmit = handleSubmit(async (values) => {
    setProblem('');
    const next = safeReturn(params.get('next'));
    const callbackURL = `/verified${next ? `?next=${encodeURIComponent(next)}` : ''}`;
    const { error } = await authClient.signUp.email({ ...values, callbackURL });
    if (error) return setProblem(authMessage(error));
    navigate(`/check-email?email=${encodeURIComponent(values.email)}`);
  });

  return (
    <NarrowPage
      title="Create your account"
      footer={
        <>
          Already have an account? <Link className="font-semibold text-steel underline" to="/sign-in">Sign in</Link>
        </>
      }
    >
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <Alert>{problem}</Alert>
        <TextField label="Your name" autoComplete="name" error={formState.errors.name?.message} {...register('name')} />
        <TextField label="E-mail" type="email" autoComplete="email" error={formState.errors.email?.message} {...register('email')} />
        <TextField
          label="Password"
          type="password"
          autoComplete="new-password"
          hint="At least 10 characters."
          error={formState.errors.password?.message}
          {...register('password')}
        />
        <Button type="submit" busy={formState.isSubmitting} className="w-full">
          {formState.isSubmitting ? 'Creating…' : 'Create account'}
        </Button>
        <p className="text-sm text-ink-soft">We will e-mail you a link to confirm your address before you can sign in.</p>
      </form>
    </NarrowPage>
  );
}
