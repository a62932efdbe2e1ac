import { useSearchParams } from 'react-router';
import { LinkButton } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { NarrowPage } from '../../../components/ui/layout';
import { useMe } from '../../../lib/session';
import { safeReturn } from './sign-in';

/** Where the confirmation link lands: better-auth has verified the address (or says why not) and signed the user in. */
export function Component() {
  const [params] = useSearchParams();
  const me = useMe();
  const failed = params.get('error');
  const next = safeReturn(params.get('next'));
  if (failed) {
    return (
      <NarrowPage title="That link did not work">
        <Alert>This confirmation link has expired or was already used. Sign in to get a new one.</Alert>
        <LinkButton to="/sign-in" className="mt-6 w-full">
          Sign in
        </LinkButton>
      </NarrowPage>
    );
  }
  return (
    <NarrowPage title="Your e-mail is confirmed">
      <p>Thank you{me.data ? `, ${me.data.user.name}` : ''}. Your account is ready.</p>
      <LinkButton to={next ?? (me.data ? '/rinks' : '/sign-in')} className="mt-6 w-full">
        {next ? 'Continue' : me.data ? 'Go to your rinks' : 'Sign in'}
      </LinkButton>
    </NarrowPage>
  );
}
