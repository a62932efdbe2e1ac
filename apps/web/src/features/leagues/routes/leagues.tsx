import type { ColumnDef } from '@tanstack/react-table';
import { useMemo } from 'react';
import { Link, useNavigate } from 'react-router';
import { DataTable } from '../../../components/ui/data-table';
import { Alert, Loading } from '../../../components/ui/feedback';
import { Card, PageHeader } from '../../../components/ui/layout';
import { NotFound } from '../../../components/ui/not-found';
import { can, useRink } from '../../../lib/rink-context';
import { useLeagues, type LeagueSummary } from '../api/get-leagues';
import { LeagueForm } from '../components/league-form';

const num = (header: string, key: 'poolCredits' | 'teams' | 'players'): ColumnDef<LeagueSummary, unknown> => ({
  accessorKey: key,
  header: () => <span className="block text-right">{header}</span>,
  cell: ({ row }) => <span className="block text-right tabular-nums">{row.original[key]}</span>,
});

export function Component() {
  const rink = useRink();
  const leagues = useLeagues(rink.slug);
  const navigate = useNavigate();
  const manage = can(rink, 'league', 'manage');
  const columns = useMemo<ColumnDef<LeagueSummary, unknown>[]>(
    () => [
      {
        accessorKey: 'name',
        header: 'League',
        cell: ({ row }) => (
          <Link className="inline-flex min-h-11 items-center font-semibold text-steel underline" to={`/rinks/${rink.slug}/leagues/${row.original.id}`}>
            {row.original.name}
          </Link>
        ),
      },
      { accessorKey: 'season', header: 'Season', cell: ({ row }) => row.original.season ?? '—' },
      { accessorKey: 'manager', header: 'League manager', cell: ({ row }) => row.original.manager ?? '—' },
      num('Pool credits', 'poolCredits'),
      num('Teams', 'teams'),
      num('Players', 'players'),
    ],
    [rink.slug],
  );
  if (!can(rink, 'league', 'read')) return <NotFound />;
  return (
    <div className="space-y-6">
      <PageHeader title="Leagues" subtitle="Each league has a pool of credits, shared out to its teams and players." />
      <div className={manage ? 'grid items-start gap-6 lg:grid-cols-[1fr_22rem]' : ''}>
        <Card title="Leagues">
          {leagues.isPending ? (
            <Loading />
          ) : leagues.isError ? (
            <Alert>{leagues.error.message}</Alert>
          ) : (
            <DataTable data={leagues.data.leagues} columns={columns} caption="Leagues of the rink" empty={manage ? 'No leagues yet: add the first one.' : 'No leagues yet.'} />
          )}
        </Card>
        {manage ? (
          <Card title="Add a league">
            <LeagueForm rink={rink} onAdded={(added) => navigate(`/rinks/${rink.slug}/leagues/${added.league.id}`)} />
          </Card>
        ) : null}
      </div>
    </div>
  );
}
