import { isRouteErrorResponse, useRouteError } from 'react-router';
import { LinkButton } from '../components/ui/button';
import { NotFound } from '../components/ui/not-found';

export function RouteError() {
  const error = useRouteError();
  if (isRouteErrorResponse(error) && error.status === 404) return <NotFound />;
  return (
    <div className="mx-auto max-w-lg px-4 py-16 text-center">
      <h1 className="text-3xl font-extrabold">Something went wrong</h1>
      <p className="mt-3 text-ink-soft">The page could not be shown. Nothing you saved was lost; reload the page to try again.</p>
      <LinkButton to="/" className="mt-6">
        Back to the start
      </LinkButton>
    </div>
  );
}
