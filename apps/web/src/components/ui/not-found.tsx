import { LinkButton } from './button';

export function NotFound({ message = 'There is nothing at this address, or it is not yours to see.' }: { message?: string }) {
  return (
    <div className="mx-auto max-w-lg px-4 py-16 text-center">
      <p className="text-sm font-bold uppercase tracking-widest text-ink-soft">Not found</p>
      <h1 className="mt-2 text-3xl font-extrabold">We could not find that page</h1>
      <p className="mt-3 text-ink-soft">{message}</p>
      <LinkButton to="/" className="mt-6">
        Back to the start
      </LinkButton>
    </div>
  );
}
