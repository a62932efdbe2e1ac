import { Link, NavLink, Outlet, useNavigate, useParams } from 'react-router';
import { LinkButton } from '../../components/ui/button';
import { useMe } from '../../lib/session';

function RinkSwitcher() {
  const { data: me } = useMe();
  const { rinkSlug } = useParams();
  const navigate = useNavigate();
  if (!me || me.rinks.length === 0) return null;
  return (
    <label className="flex items-center gap-2 text-sm">
      <span className="sr-only sm:not-sr-only sm:text-glacier">Rink</span>
      <select
        aria-label="Switch rink"
        className="min-h-11 max-w-48 rounded-lg border border-white/20 bg-ink px-2 font-semibold text-frost"
        value={rinkSlug ?? ''}
        onChange={(e) => navigate(e.target.value ? `/rinks/${e.target.value}` : '/rinks')}
      >
        <option value="">All my rinks</option>
        {me.rinks.map((r) => (
          <option key={r.slug} value={r.slug}>
            {r.name}
          </option>
        ))}
      </select>
    </label>
  );
}

export function RootLayout() {
  const { data: me } = useMe();
  return (
    <div className="flex min-h-screen flex-col">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-white focus:p-2">
        Skip to content
      </a>
      <header className="bg-ink text-frost">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-3 px-4 py-2">
          <Link to={me ? '/rinks' : '/'} className="flex min-h-11 items-center gap-2 text-lg font-extrabold tracking-tight">
            <svg aria-hidden="true" viewBox="0 0 32 32" className="h-7 w-7">
              <rect width="32" height="32" rx="7" fill="#2F6FAB" />
              <path d="M7 21h18M9 21c0-6 3-10 7-10s7 4 7 10" fill="none" stroke="#DCEBF5" strokeWidth="2.5" strokeLinecap="round" />
            </svg>
            Rinkwright
          </Link>
          <nav aria-label="Account" className="flex flex-wrap items-center gap-2">
            {me ? (
              <>
                <RinkSwitcher />
                {me.user.platformAdmin ? (
                  <NavLink to="/platform" className="flex min-h-11 items-center rounded-lg px-3 text-sm font-semibold hover:bg-white/10">
                    Platform
                  </NavLink>
                ) : null}
                <NavLink to="/account" className="flex min-h-11 items-center rounded-lg px-3 text-sm font-semibold hover:bg-white/10">
                  {me.user.name}
                </NavLink>
              </>
            ) : (
              <>
                <NavLink to="/sign-in" className="flex min-h-11 items-center rounded-lg px-3 text-sm font-semibold hover:bg-white/10">
                  Sign in
                </NavLink>
                <LinkButton to="/sign-up">Create account</LinkButton>
              </>
            )}
          </nav>
        </div>
      </header>
      <main id="main" className="flex-1">
        <Outlet />
      </main>
      <footer className="border-t border-rule py-6 text-center text-sm text-ink-soft">
        Rinkwright · <a className="underline" href="/api/docs/">API documentation</a>
      </footer>
    </div>
  );
}
