import { useState } from 'react';
import { Link, useSearchParams } from 'react-router';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { NarrowPage } from '../../../components/ui/layout';
import { authClient, authMessage } from '../../../lib/auth-client';
import { useConfig } from '../../../lib/session';

export function Component() {
  const [params] = useSearchParams();
  const email = params.get('email') ?? '';
  const config = useConfig();
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function resend() {
    setBusy(true);
    const { error } = await authClient.sendVerificationEmail({ email, callbackURL: '/verified' });
    setBusy(false);
    setNote(error ? { tone: 'error', text: authMessage(error) } : { tone: 'success', text: 'A new link is on its way.' });
  }

  return (
    <NarrowPage title="Check your e-mail" footer={<Link className="font-semibold text-steel underline" to="/sign-in">Back to sign-in</Link>}>
      <div className="space-y-4">
        <p>
          We sent a confirmation link to <strong>{email || 'your address'}</strong>. Open it to finish setting up your account; it works
          for 24 hours.
        </p>
        {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
        {config.data?.mailInboxUrl ? (
          <Alert tone="info">
            This is a local demo: the e-mail is caught by the{' '}
            <a className="font-semibold underline" href={config.data.mailInboxUrl} target="_blank" rel="noreferrer">
              demo inbox
            </a>
            .
          </Alert>
        ) : null}
        {email ? (
          <Button tone="secondary" busy={busy} onClick={resend} className="w-full">
            Send the link again
          </Button>
        ) : null}
      </div>
    </NarrowPage>
  );
}
