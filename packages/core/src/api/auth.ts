import { z } from 'zod';
import { email } from './common';

// Forms of the auth screens; the server side of these is better-auth's own validation.
const password = z.string().min(10, 'At least 10 characters').max(128, 'At most 128 characters');

export const signUpForm = z.object({
  name: z.string().trim().min(2, 'At least 2 characters').max(200),
  email,
  password,
});
export const signInForm = z.object({ email, password: z.string().min(1, 'Enter your password') });
export const forgotPasswordForm = z.object({ email });
export const resetPasswordForm = z
  .object({ password, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { message: 'The two passwords differ', path: ['confirm'] });
export const changePasswordForm = z
  .object({ currentPassword: z.string().min(1, 'Enter your current password'), newPassword: password, confirm: z.string() })
  .refine((v) => v.newPassword === v.confirm, { message: 'The two passwords differ', path: ['confirm'] });
export const profileForm = z.object({ name: z.string().trim().min(2, 'At least 2 characters').max(200) });

export type SignUpForm = z.infer<typeof signUpForm>;
export type SignInForm = z.infer<typeof signInForm>;
export type ForgotPasswordForm = z.infer<typeof forgotPasswordForm>;
export type ResetPasswordForm = z.infer<typeof resetPasswordForm>;
export type ChangePasswordForm = z.infer<typeof changePasswordForm>;
export type ProfileForm = z.infer<typeof profileForm>;
