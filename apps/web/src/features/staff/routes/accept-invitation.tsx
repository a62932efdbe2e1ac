import { useState } from 'react';
import { useNavigate, useParams } from 'react-router';
import { ROLE_LABELS } from '@rinkwright/core';
import { Button, LinkButton } from '../../../components/ui/button';
import { Alert, Loading } from '../../../components/ui/feedback';
import { NarrowPage } from '../../../components/ui/layout';
import { NotFound } from '../../../components/ui/not-found';
import { ApiError } from '../../../lib/api-client';
import { authClient } from '../../../lib/auth-client';
import { useMe } from '../../../lib/session';
import { useAcceptInvitation } from '../api/accept-invitation';
import { useInvitationPreview } from '../api/get-invitation-preview';

export function Component() {
  const { invitationId = '' } = useParams();
  const navigate = useNavigate();
  const preview = useInvitationPreview(invitationId);
  const me = useMe();
  const accept = useAcceptInvitation();
  const [problem, setProblem] = useState('');

  if (preview.isPending || me.isPending) return <Loading />;
  if (preview.isError) return <NotFound message="This invitation does not exist. Ask the rink for a new one." />;
  const inv = preview.data;
  const here = `/invitations/${invitationId}`;
  const title = `Join ${inv.rinkName}`;

  if (inv.status !== 'pending') {
    const why = { accepted: 'has already been accepted', rejected: 'was declined', canceled: 'was revoked by the rink', expired: 'has expired' }[inv.status];
    return (
      <NarrowPage title={title}>
        <Alert tone="info">This invitation {why}. Ask the rink's manager for a new one if you still need access.</Alert>
      </NarrowPage>
    );
  }

  const intro = (
    <p className="mb-6">
      You are invited to work at <strong>{inv.rinkName}</strong> as <strong>{ROLE_LABELS[inv.role].toLowerCase()}</strong>. The invitation is for{' '}
      <strong>{inv.email}</strong>.
    </p>
  );

  if (!me.data) {
    const next = encodeURIComponent(here);
    return (
      <NarrowPage title={title}>
        {intro}
        <div className="grid gap-3">
          <LinkButton to={`/sign-up?email=${encodeURIComponent(inv.email)}&next=${next}`}>Create an account to accept</LinkButton>
          <LinkButton tone="secondary" to={`/sign-in?email=${encodeURIComponent(inv.email)}&next=${next}`}>
            I have an account: sign in
          </LinkButton>
        </div>
      </NarrowPage>
    );
  }

  if (me.data.user.email !== inv.email) {
    return (
      <NarrowPage title={title}>
        {intro}
        <Alert>You are signed in as {me.data.user.email}. Sign out and sign in as {inv.email} to accept.</Alert>
        <Button
          tone="secondary"
          className="mt-4 w-full"
          onClick={async () => {
            await authClient.signOut();
            navigate(`/sign-in?email=${encodeURIComponent(inv.email)}&next=${encodeURIComponent(here)}`);
          }}
        >
          Sign out
        </Button>
      </NarrowPage>
    );
  }

  return (
    <NarrowPage title={title}>
      {intro}
      <Alert>{problem}</Alert>
      <Button
        className="mt-2 w-full"
        busy={accept.isPending}
        onClick={() =>
          accept.mutate(invitationId, {
            onSuccess: ({ slug }) => navigate(`/rinks/${slug}`),
            onError: (e) => setProblem(e instanceof ApiError ? e.message : 'That did not work. Try again.'),
          })
        }
      >
        {accept.isPending ? 'Joining…' : `Accept and join ${inv.rinkName}`}
      </Button>
    </NarrowPage>
  );
}
