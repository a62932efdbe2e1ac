import { Link, useParams } from 'react-router';
import { Alert, Loading } from '../../../components/ui/feedback';
import { Card, PageHeader } from '../../../components/ui/layout';
import { LevelScale } from '../../../components/ui/level-reading';
import { NotFound } from '../../../components/ui/not-found';
import { ApiError } from '../../../lib/api-client';
import { formatDateTime } from '../../../lib/format';
import { can, useRink } from '../../../lib/rink-context';
import { showLength } from '../../../lib/units';
import { useStation } from '../api/get-station';
import { useUpdateStation } from '../api/update-station';
import { AdjustmentForm } from '../components/adjustment-form';
import { AdjustmentsLog } from '../components/adjustments-log';
import { BandMix } from '../components/band-mix';
import { CheckReadingForm } from '../components/check-reading-form';
import { DressingForm } from '../components/dressing-form';
import { DriftBanner, DriftStatus } from '../components/drift';
import { LevelingAdviceView } from '../components/leveling-advice';
import { MountWheelForm } from '../components/mount-wheel-form';
import { ReadingChart } from '../components/reading-chart';
import { RemoveWheelButton } from '../components/remove-wheel-button';
import { StatusBadge } from '../components/station-card';
import { StationForm } from '../components/station-form';
import { limitText } from '../components/typed';
import { WheelLife } from '../components/wheel-life';
import { WheelLog } from '../components/wheel-log';

export function Component() {
  const rink = useRink();
  const { stationId = '' } = useParams();
  const query = useStation(rink.slug, stationId);
  const update = useUpdateStation(rink.slug, stationId);
  if (!can(rink, 'station', 'read')) return <NotFound />;
  if (query.isPending) return <Loading label="Loading the station…" />;
  if (query.isError) {
    if (query.error instanceof ApiError && query.error.status === 404) return <NotFound message="No such station at this rink." />;
    return <Alert>{query.error.message}</Alert>;
  }

  const detail = query.data;
  const { station, bands } = detail;
  const unit = rink.unitPreference;
  const tz = rink.timeZone;
  const wheel = station.wheel;
  const latest = detail.readings[detail.readings.length - 1];
  const bandsWord = bands.precision ? "the rink's precision bands" : bands.source === 'station' ? "this station's own bands" : "the rink's level bands";
  const upkeep = can(rink, 'station', 'upkeep');
  const upkeepCards = [
    { key: 'check', title: 'Check reading', show: true, body: <CheckReadingForm slug={rink.slug} detail={detail} unit={unit} /> },
    { key: 'adjust', title: 'Leveling adjustment', show: true, body: <AdjustmentForm slug={rink.slug} detail={detail} /> },
    { key: 'dress', title: 'Dressing', show: wheel !== null, body: <DressingForm key={wheel?.id} slug={rink.slug} detail={detail} unit={unit} /> },
    { key: 'mount', title: wheel ? 'Change the wheel' : 'Mount a wheel', show: true, body: <MountWheelForm slug={rink.slug} detail={detail} unit={unit} /> },
  ];

  return (
    <div className="space-y-6">
      <p>
        <Link to=".." relative="path" className="inline-flex min-h-11 items-center font-semibold text-steel-dark underline-offset-4 hover:underline">
          ← All stations
        </Link>
      </p>
      <PageHeader
        title={station.name}
        subtitle={
          <span className="tabular-nums">
            {wheel ? `${wheel.label}, grit ${wheel.grit} · hollow ${showLength(wheel.hollowNm, unit, 'hollow')} · ${showLength(wheel.diameterNm, unit, 'diameter')}` : 'No wheel mounted'} · {bandsWord}: true up
            to ±{limitText(bands.trueNm, unit)}, fair up to ±{limitText(bands.fairNm, unit)}
          </span>
        }
        actions={<StatusBadge status={station.status} />}
      />
      <DriftBanner detail={detail} unit={unit} timeZone={tz} />

      <div className="grid items-start gap-6 lg:grid-cols-2">
        <Card title="Leveling advice">
          <LevelingAdviceView detail={detail} unit={unit} />
        </Card>
        <Card title="Latest reading">
          {latest ? (
            <>
              <LevelScale readingNm={latest.readingNm} bands={bands} unit={unit} large />
              <p className="mt-2 text-sm text-ink-soft">
                {latest.kind === 'check' ? 'Check reading' : 'Sharpening'}, {formatDateTime(latest.takenAt, tz)}
              </p>
            </>
          ) : (
            <p className="text-sm text-ink-soft">No readings yet.</p>
          )}
          {latest ? (
            <>
              <h3 className="mb-2 mt-5 font-bold">Band mix</h3>
              <BandMix mix={detail.bandMix} />
            </>
          ) : null}
        </Card>
      </div>

      <Card title="Level readings and drift watch">
        <div className="mb-3">
          <DriftStatus detail={detail} />
        </div>
        <ReadingChart detail={detail} unit={unit} timeZone={tz} />
      </Card>

      <div className="grid items-start gap-6 lg:grid-cols-2">
        <Card title="Wheel life">
          <WheelLife detail={detail} unit={unit} timeZone={tz} />
          {upkeep ? (
            <div className="mt-4">
              <RemoveWheelButton slug={rink.slug} station={station} />
            </div>
          ) : null}
        </Card>
        <Card title="Wheel log">
          <WheelLog events={detail.wheelEvents} unit={unit} timeZone={tz} />
        </Card>
      </div>

      {upkeep ? (
        <section aria-labelledby="upkeep-title" className="space-y-4">
          <h2 id="upkeep-title" className="text-xl font-extrabold">
            Upkeep
          </h2>
          {/* A station without a wheel has one job first: mounting one. Keyed, so the forms keep their state as they move. */}
          <div className="grid items-start gap-6 lg:grid-cols-2">
            {(wheel ? upkeepCards : [upkeepCards[3]!, ...upkeepCards.slice(0, 3)]).filter((c) => c.show).map((c) => (
              <Card key={c.key} title={c.title}>
                {c.body}
              </Card>
            ))}
          </div>
        </section>
      ) : null}

      <Card title="Leveling adjustments">
        <AdjustmentsLog detail={detail} unit={unit} timeZone={tz} />
      </Card>

      {can(rink, 'station', 'manage') ? (
        <Card title="Station settings">
          <StationForm key={station.id} unit={unit} station={station} withBands submitLabel="Save station" save={(input) => update.mutateAsync(input)} />
        </Card>
      ) : null}
    </div>
  );
}
