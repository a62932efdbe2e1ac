import { LinkButton } from '../../../components/ui/button';
import { homeOf, useMe } from '../../../lib/session';

const points = [
  ['Sell prepaid sharpening', 'Punch cards, memberships and league credit packs, redeemed one pair at a time without ever losing or doubling a credit.'],
  ['Run the counter', 'Take skates in, promise a time from the real queue, and tell skaters the moment their skates are ready.'],
  ['Log every pair', 'Hollow, passes, blade width and a level reading per blade, stored with the sharpening and never overwritten.'],
  ['Keep stations true', 'Level readings against your own limits, a drift watch per station, leveling advice from its history, and wheel wear.'],
] as const;

export function Component() {
  const me = useMe();
  return (
    <div>
      <section className="bg-ink text-frost">
        <div className="mx-auto max-w-5xl px-4 py-16 sm:py-24">
          <p className="text-sm font-bold uppercase tracking-widest text-glacier">For rinks with a sharpening counter</p>
          <h1 className="mt-3 max-w-3xl text-4xl font-extrabold tracking-tight sm:text-5xl">One system for the whole sharpening counter.</h1>
          <p className="mt-5 max-w-2xl text-lg text-glacier">
            Rinkwright sells prepaid sharpening, runs the queue at the counter, logs every pair with its measurements, and watches each
            station's edge level, so your skaters get the same edge every time.
          </p>
          <div className="mt-8 flex flex-wrap gap-3">
            {me.data ? (
              <LinkButton to={homeOf(me.data)}>Go to your rinks</LinkButton>
            ) : (
              <>
                <LinkButton to="/sign-up">Set up your rink</LinkButton>
                <LinkButton to="/sign-in" tone="secondary">
                  Sign in
                </LinkButton>
              </>
            )}
          </div>
        </div>
      </section>
      <section className="mx-auto grid max-w-5xl gap-6 px-4 py-12 sm:grid-cols-2">
        {points.map(([title, text]) => (
          <div key={title} className="rounded-xl border border-rule bg-white p-6">
            <h2 className="text-lg font-bold">{title}</h2>
            <p className="mt-2 text-ink-soft">{text}</p>
          </div>
        ))}
      </section>
    </div>
  );
}
