import { Alert, Loading } from '../../../components/ui/feedback';
import { Card, PageHeader } from '../../../components/ui/layout';
import { NotFound } from '../../../components/ui/not-found';
import { useStations } from '../../../lib/queries/stations';
import { can, useRink } from '../../../lib/rink-context';
import { useCreateStation } from '../api/create-station';
import { DeskSettingsCard } from '../components/desk-settings-card';
import { StationCard } from '../components/station-card';
import { StationForm } from '../components/station-form';

export function Component() {
  const rink = useRink();
  const stations = useStations(rink.slug);
  const create = useCreateStation(rink.slug);
  if (!can(rink, 'station', 'read')) return <NotFound />;
  const manager = can(rink, 'station', 'manage');

  return (
    <div className="space-y-6">
      <PageHeader title="Stations" subtitle="Each sharpening machine at the counter: its wheel, its queue, and its quality page." />
      {stations.isPending ? (
        <Loading label="Loading the stations…" />
      ) : stations.isError ? (
        <Alert>{stations.error.message}</Alert>
      ) : stations.data.stations.length === 0 ? (
        <Alert tone="info">{manager ? 'No stations yet. Add the first one below.' : 'No stations yet. A manager adds them.'}</Alert>
      ) : (
        <ul className="grid gap-4 md:grid-cols-2 lg:grid-cols-3" aria-label="Stations">
          {stations.data.stations.map((s) => (
            <li key={s.id} className="flex">
              <StationCard station={s} unit={rink.unitPreference} />
            </li>
          ))}
        </ul>
      )}
      <div className="grid items-start gap-6 lg:grid-cols-2">
        {manager ? (
          <Card title="Add a station">
            <p className="mb-4 text-sm text-ink-soft">Its own level bands and the precision switch are on the station's page once it is added.</p>
            <StationForm unit={rink.unitPreference} station={null} withBands={false} submitLabel="Add station" save={(input) => create.mutateAsync(input)} />
          </Card>
        ) : null}
        <DeskSettingsCard rink={rink} />
      </div>
    </div>
  );
}
