import { useState } from 'react';
import { Link, useParams, useSearchParams } from 'react-router';
import type { LeagueDetail, RinkSummary } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert, Loading } from '../../../components/ui/feedback';
import { SelectField } from '../../../components/ui/field';
import { Card, PageHeader, Stat } from '../../../components/ui/layout';
import { NotFound } from '../../../components/ui/not-found';
import { ApiError } from '../../../lib/api-client';
import { formatCount, formatDate, formatDateTime, formatMoney } from '../../../lib/format';
import { can, useRink } from '../../../lib/rink-context';
import { useBuyPack } from '../api/buy-pack';
import { useLeague } from '../api/get-league';
import { AllocateForm } from '../components/allocate-form';
import { RosterUpload } from '../components/roster-upload';

const th = 'px-3 py-2 font-semibold text-ink-soft';
const td = 'px-3 py-2 align-top';

function PoolLots({ rink, pool, manage }: { rink: RinkSummary; pool: LeagueDetail['pool']; manage: boolean }) {
  if (pool.lots.length === 0) return <p className="text-ink-soft">{manage ? 'No packs bought yet: buy a league pack below to fill the pool.' : 'No packs bought yet.'}</p>;
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">Lots of the league's pool</caption>
        <thead>
          <tr className="border-b border-rule">
            <th scope="col" className={th}>Pack</th>
            <th scope="col" className={`${th} text-right`}>Left / credits</th>
            <th scope="col" className={th}>Expires</th>
            <th scope="col" className={`${th} text-right`}>Value left</th>
          </tr>
        </thead>
        <tbody>
          {pool.lots.map((l) => (
            <tr key={l.id} className="border-b border-rule/60 last:border-0">
              <td className={td}>{l.productName ?? '—'}</td>
              <td className={`${td} text-right tabular-nums`}>
                {formatCount(l.remaining)} / {formatCount(l.credits)}
              </td>
              <td className={td}>{l.expiresAt ? formatDate(l.expiresAt, rink.timeZone) : 'No expiry'}</td>
              <td className={`${td} text-right tabular-nums`}>{formatMoney(l.remainingValueMinor, pool.currency)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function BuyPack({ slug, league }: { slug: string; league: LeagueDetail }) {
  const buy = useBuyPack(slug, league.league.id);
  const [productId, setProductId] = useState('');
  const [problem, setProblem] = useState('');
  if (league.packs.length === 0) return <p className="text-ink-soft">No league pack is on sale: a manager adds one under Products.</p>;
  async function go() {
    setProblem('');
    try {
      const { url } = await buy.mutateAsync(productId);
      window.location.assign(url);
    } catch (error) {
      setProblem(error instanceof Error ? error.message : 'The payment service did not answer');
    }
  }
  return (
    <form className="space-y-3" aria-label="Buy a league pack" onSubmit={(e) => (e.preventDefault(), void go())}>
      <Alert>{problem}</Alert>
      <SelectField
        label="League pack"
        value={productId}
        onChange={(e) => setProductId(e.target.value)}
        options={[
          { value: '', label: 'Choose a pack' },
          ...league.packs.map((p) => ({ value: p.id, label: `${p.name} · ${p.credits} credits · ${formatMoney(p.price.amountMinor, p.price.currency)}` })),
        ]}
      />
      <Button type="submit" disabled={!productId || buy.isPending} busy={buy.isPending}>
        Buy a league pack
      </Button>
    </form>
  );
}

function Teams({ league }: { league: LeagueDetail }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">Teams with their allocation, use and players</caption>
        <thead>
          <tr className="border-b border-rule">
            <th scope="col" className={th}>Team</th>
            <th scope="col" className={`${th} text-right`}>Allocated</th>
            <th scope="col" className={`${th} text-right`}>Used</th>
            <th scope="col" className={`${th} text-right`}>Remaining</th>
            <th scope="col" className={th}>Players (own credits)</th>
          </tr>
        </thead>
        <tbody>
          {league.teams.map((t) => (
            <tr key={t.id} className="border-b border-rule/60 last:border-0">
              <td className={`${td} font-semibold`}>{t.name}</td>
              <td className={`${td} text-right tabular-nums`}>{formatCount(t.allocated)}</td>
              <td className={`${td} text-right tabular-nums`}>{formatCount(t.used)}</td>
              <td className={`${td} text-right font-semibold tabular-nums`}>{formatCount(t.remaining)}</td>
              <td className={td}>
                <ul className="space-y-1">
                  {t.players.map((p) => (
                    <li key={p.id} className="tabular-nums">
                      {p.name}
                      {p.email ? <span className="text-ink-soft"> · {p.email}</span> : null} · {formatCount(p.credits)} credit{p.credits === 1 ? '' : 's'}
                    </li>
                  ))}
                  {t.players.length === 0 ? <li className="text-ink-soft">No players yet.</li> : null}
                </ul>
              </td>
            </tr>
          ))}
          {league.teams.length === 0 ? (
            <tr>
              <td colSpan={5} className="px-3 py-6 text-center text-ink-soft">
                No teams yet: import a roster.
              </td>
            </tr>
          ) : null}
        </tbody>
      </table>
    </div>
  );
}

export function Component() {
  const rink = useRink();
  const { leagueId = '' } = useParams();
  const [params] = useSearchParams();
  const detail = useLeague(rink.slug, leagueId);
  const manage = can(rink, 'league', 'manage');
  if (!can(rink, 'league', 'read')) return <NotFound />;
  if (detail.isPending) return <Loading />;
  if (detail.isError) return detail.error instanceof ApiError && detail.error.status === 404 ? <NotFound message="No such league at this rink." /> : <Alert>{detail.error.message}</Alert>;
  const d = detail.data;
  // Counted from the teams on this page, so the figure always matches the table below it.
  const players = d.teams.reduce((n, t) => n + t.players.length, 0);
  return (
    <div className="space-y-6">
      <PageHeader
        title={d.league.name}
        subtitle={
          <>
            {d.league.season ? `${d.league.season} · ` : ''}
            {d.league.manager ? `League manager ${d.league.manager}` : 'No league manager'} · <Link className="text-steel underline" to={`/rinks/${rink.slug}/leagues`}>All leagues</Link>
          </>
        }
      />
      {params.has('session') ? <Alert tone="info">Back from checkout. The pack's credits appear in the pool as soon as the payment service confirms the payment.</Alert> : null}
      <Card title="Pool">
        <dl className="mb-4 grid gap-3 sm:grid-cols-3">
          <Stat label="Credits in the pool" value={formatCount(d.pool.credits)} />
          <Stat label="Worth" value={formatMoney(d.pool.valueMinor, d.pool.currency)} />
          <Stat label="Teams · players" value={`${formatCount(d.teams.length)} · ${formatCount(players)}`} />
        </dl>
        <PoolLots rink={rink} pool={d.pool} manage={manage} />
      </Card>
      {manage ? (
        <div className="grid items-start gap-6 lg:grid-cols-2">
          <Card title="Buy a league pack">
            <BuyPack slug={rink.slug} league={d} />
          </Card>
          <Card title="Allocate credits">
            <AllocateForm slug={rink.slug} leagueId={d.league.id} teams={d.teams} pool={d.pool.credits} />
          </Card>
        </div>
      ) : null}
      <Card title="Teams">
        <Teams league={d} />
      </Card>
      {manage ? (
        <Card title="Roster">
          <RosterUpload slug={rink.slug} leagueId={d.league.id} />
          {d.imports.length > 0 ? (
            <section aria-label="Past imports" className="mt-6">
              <h3 className="mb-2 font-bold">Past imports</h3>
              <ul className="divide-y divide-rule text-sm">
                {d.imports.map((i) => (
                  <li key={i.id} className="py-2 tabular-nums">
                    {i.rowCount} rows · {formatDateTime(i.createdAt, rink.timeZone)} · {i.by}
                  </li>
                ))}
              </ul>
            </section>
          ) : null}
        </Card>
      ) : null}
    </div>
  );
}
