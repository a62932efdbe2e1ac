import { randomUUID } from 'node:crypto';
import type { Logger } from 'pino';
import { betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { admin, organization } from 'better-auth/plugins';
import { account, directory, invitation, member, rateLimit, rink, session, user, verification } from '@rinkwright/db';
import type { Database } from '@rinkwright/db/unscoped';
import { ROLE_LABELS, type StaffRole } from '@rinkwright/core';
import { ac, roles } from './access';
import type { Env } from './env';
import { actionMail, type Mailer } from './lib/mailer';

export const CLIENT_IP_HEADER = 'x-rinkwright-client-ip';

export function trustedOrigins(env: Env): string[] {
  return [new URL(env.APP_URL).origin, ...env.EXTRA_ORIGINS];
}

export function createAuth(env: Env, db: Database, mailer: Mailer, logger: Logger) {
  const appUrl = env.APP_URL.replace(/\/$/, '');
  return betterAuth({
    appName: 'Rinkwright',
    // The library's own messages go to our logger, at our level.
    logger: {
      disabled: env.LOG_LEVEL === 'silent',
      log: (level, message, ...args) => logger[level]({ detail: args }, `auth: ${message}`),
    },
    baseURL: appUrl,
    basePath: '/api/auth',
    secret: env.BETTER_AUTH_SECRET,
    trustedOrigins: trustedOrigins(env),
    database: drizzleAdapter(db, {
      provider: 'mysql',
      schema: { user, session, account, verification, rink, member, invitation, rateLimit },
    }),
    emailAndPassword: {
      enabled: true,
      requireEmailVerification: true,
      minPasswordLength: 10,
      maxPasswordLength: 128,
      revokeSessionsOnPasswordReset: true,
      sendResetPassword: async ({ user: person, url }) => {
        await mailer.deliver(
          actionMail({
            to: person.email,
            subject: 'Reset your Rinkwright password',
            greeting: `Hello ${person.name},`,
            body: 'Someone asked to reset the password of your Rinkwright account. The link works for one hour.',
            action: 'Choose a new password',
            url,
            footer: 'If it was not you, ignore this e-mail: your password stays as it is.',
          }),
          { redactAfterSend: true },
        );
      },
    },
    emailVerification: {
      sendOnSignUp: true,
      sendOnSignIn: true,
      autoSignInAfterVerification: true,
      expiresIn: 24 * 3600,
      sendVerificationEmail: async ({ user: person, url }) => {
        await mailer.deliver(
          actionMail({
            to: person.email,
            subject: 'Confirm your e-mail for Rinkwright',
            greeting: `Hello ${person.name},`,
            body: 'Confirm this address to finish setting up your Rinkwright account. The link works for 24 hours.',
            action: 'Confirm my e-mail',
            url,
            footer: 'If you did not sign up, ignore this e-mail.',
          }),
          { redactAfterSend: true },
        );
      },
      afterEmailVerification: async (person) => {
        await directory.linkCustomersByVerifiedEmail(person.id);
      },
    },
    session: {
      expiresIn: 30 * 24 * 3600,
      updateAge: 24 * 3600,
      // Every request needs the session; a signed copy in a cookie spares the database that read for a while
      // (env.ts, SESSION_CACHE_SECONDS, with its cost). Staff access to a rink is still read on every request.
      cookieCache: { enabled: env.SESSION_CACHE_SECONDS > 0, maxAge: env.SESSION_CACHE_SECONDS },
    },
    rateLimit: {
      enabled: true,
      storage: 'database',
      window: 60,
      max: env.AUTH_RATE_LIMIT_MAX,
      customRules: {
        '/sign-in/email': { window: 60, max: Math.max(5, Math.floor(env.AUTH_RATE_LIMIT_MAX / 3)) },
        '/request-password-reset': { window: 300, max: 5 },
        '/send-verification-email': { window: 300, max: 5 },
      },
    },
    advanced: {
      cookiePrefix: 'rinkwright',
      useSecureCookies: appUrl.startsWith('https://'),
      defaultCookieAttributes: { httpOnly: true, sameSite: 'lax' },
      ipAddress: { ipAddressHeaders: [CLIENT_IP_HEADER] },
      database: { generateId: () => randomUUID() },
    },
    plugins: [
      organization({
        ac,
        roles,
        creatorRole: 'owner',
        allowUserToCreateOrganization: true,
        invitationExpiresIn: 7 * 24 * 3600,
        cancelPendingInvitationsOnReInvite: true,
        requireEmailVerificationOnInvitation: true,
        schema: {
          organization: {
            modelName: 'rink',
            additionalFields: {
              timeZone: { type: 'string', required: true, input: true },
              currency: { type: 'string', required: true, input: true },
              unitPreference: { type: 'string', required: true, input: true },
            },
          },
        },
        sendInvitationEmail: async (data) => {
          const role = ROLE_LABELS[data.role as StaffRole] ?? data.role;
          await mailer.deliver(
            actionMail({
              to: data.email,
              subject: `You are invited to ${data.organization.name} on Rinkwright`,
              greeting: 'Hello,',
              body: `${data.inviter.user.name} invites you to join ${data.organization.name} as ${role.toLowerCase()}. The invitation works for 7 days.`,
              action: 'Open the invitation',
              url: `${appUrl}/invitations/${data.id}`,
              footer: 'Sign in or create an account with this e-mail address to accept it.',
            }),
            { redactAfterSend: true },
          );
        },
      }),
      admin({ defaultRole: 'user', adminRoles: ['admin'] }),
    ],
  });
}

export type Auth = ReturnType<typeof createAuth>;
