import { dismiss, flush, usePendingWrites } from '../../lib/outbox';
import { Button } from './button';

/** What the counter has not yet got through to the server, always in view, and what the server refused. */
export function PendingWrites({ rinkSlug }: { rinkSlug: string }) {
  const writes = usePendingWrites(rinkSlug);
  if (writes.length === 0) return null;
  const waiting = writes.filter((w) => !w.refused);
  const refused = writes.filter((w) => w.refused);
  return (
    <div className="mb-4 space-y-2">
      {waiting.length > 0 ? (
        <div role="status" className="flex flex-wrap items-center justify-between gap-3 rounded-lg border-l-4 border-amber bg-amber-50 px-4 py-3 text-sm">
          <div>
            <p className="font-bold" data-testid="pending-count">
              {waiting.length} change{waiting.length === 1 ? '' : 's'} waiting to be sent
            </p>
            <p className="text-ink-soft">Saved on this tablet; they go out by themselves when the connection is back.</p>
            <ul className="mt-1 list-disc pl-5">
              {waiting.map((w) => (
                <li key={w.key}>{w.label}</li>
              ))}
            </ul>
          </div>
          <Button tone="secondary" onClick={() => void flush()}>
            Try now
          </Button>
        </div>
      ) : null}
      {refused.map((w) => (
        <div key={w.key} role="alert" className="flex flex-wrap items-center justify-between gap-3 rounded-lg border-l-4 border-brick bg-red-50 px-4 py-3 text-sm">
          <p>
            <span className="font-bold">Not saved: {w.label}.</span> {w.refused}
          </p>
          <Button tone="secondary" onClick={() => void dismiss(w.key)}>
            Dismiss
          </Button>
        </div>
      ))}
    </div>
  );
}
