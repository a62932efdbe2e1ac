import { useState } from 'react';
import { Link, Outlet, useParams } from 'react-router';
import type { SkateProfileInput, SkateProfileRow } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert, Loading } from '../../../components/ui/feedback';
import { TextField } from '../../../components/ui/field';
import { Card, PageHeader } from '../../../components/ui/layout';
import { MemberQr } from '../../../components/ui/member-qr';
import { NotFound } from '../../../components/ui/not-found';
import { ApiError } from '../../../lib/api-client';
import { formatDateTime } from '../../../lib/format';
import { can, useRink } from '../../../lib/rink-context';
import { lengthInput, parseLength, radiusToNm, showLength, showRadius } from '../../../lib/units';
import { useAddProfile } from '../api/add-profile';
import { useCustomer } from '../api/get-customer';
import { useUpdateProfile } from '../api/update-profile';
import { HollowField } from '../components/hollow-field';
import { STATE_WORDS } from '../components/state-words';

/** Adds a skate profile, or changes one when `profile` is given. */
function ProfileForm({ slug, customerId, unit, profile, onDone }: { slug: string; customerId: string; unit: 'in' | 'mm'; profile?: SkateProfileRow; onDone?: () => void }) {
  const add = useAddProfile(slug, customerId);
  const update = useUpdateProfile(slug, customerId);
  const [label, setLabel] = useState(profile?.label ?? '');
  const [width, setWidth] = useState(lengthInput(profile?.bladeWidthNm, unit, 'width'));
  const [hollowNm, setHollowNm] = useState<number | null>(profile?.preferredHollowNm ?? null);
  const [notes, setNotes] = useState(profile?.notes ?? '');
  const [radius, setRadius] = useState(profile?.profileRadiusNm ? showRadius(profile.profileRadiusNm, unit).replace(/ (ft|m)$/, '') : '');
  const [problem, setProblem] = useState('');
  async function submit() {
    setProblem('');
    const input: SkateProfileInput = { label, bladeWidthNm: width ? parseLength(width, unit) : null, preferredHollowNm: hollowNm, profileRadiusNm: radius ? radiusToNm(radius, unit) : null, notes: notes || null };
    try {
      if (profile) {
        await update.mutateAsync({ profileId: profile.id, input });
        onDone?.();
        return;
      }
      await add.mutateAsync(input);
      setLabel('');
      setWidth('');
      setNotes('');
      setHollowNm(null);
    } catch (error) {
      setProblem(error instanceof ApiError && error.fields ? Object.values(error.fields).flat().join(' ') : String((error as Error).message));
    }
  }
  return (
    <form className="grid gap-3 sm:grid-cols-5 sm:items-end" onSubmit={(e) => (e.preventDefault(), void submit())} aria-label={profile ? `Change ${profile.label}` : 'Add a skate profile'}>
      <TextField label="Label" placeholder="e.g. Game skates" value={label} onChange={(e) => setLabel(e.target.value)} />
      <TextField label={`Blade width (${unit})`} value={width} onChange={(e) => setWidth(e.target.value)} inputMode="decimal" />
      <HollowField label="Preferred hollow" valueNm={hollowNm} onChange={setHollowNm} unit={unit} />
      <TextField label={`Profile radius (${unit === 'in' ? 'ft' : 'm'})`} value={radius} onChange={(e) => setRadius(e.target.value)} inputMode="decimal" />
      <TextField label="Notes" value={notes} onChange={(e) => setNotes(e.target.value)} />
      <div className="sm:col-span-5">
        <Alert>{problem}</Alert>
      </div>
      <Button type="submit" busy={add.isPending || update.isPending}>
        {profile ? 'Save profile' : 'Add profile'}
      </Button>
    </form>
  );
}

function ProfileRow({ slug, customerId, unit, profile, canEdit }: { slug: string; customerId: string; unit: 'in' | 'mm'; profile: SkateProfileRow; canEdit: boolean }) {
  const [editing, setEditing] = useState(false);
  return (
    <li className="py-2">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <span>
          <span className="font-semibold">{profile.label}</span> · blade {showLength(profile.bladeWidthNm, unit, 'width')} · hollow {showLength(profile.preferredHollowNm, unit, 'hollow')}
          {profile.profileRadiusNm ? ` · profile ${showRadius(profile.profileRadiusNm, unit)}` : ''}
          {profile.notes ? <span className="block text-sm text-ink-soft">{profile.notes}</span> : null}
        </span>
        {canEdit ? (
          <Button tone="quiet" onClick={() => setEditing(!editing)}>
            {editing ? 'Cancel' : 'Change'}
          </Button>
        ) : null}
      </div>
      {editing ? <ProfileForm slug={slug} customerId={customerId} unit={unit} profile={profile} onDone={() => setEditing(false)} /> : null}
    </li>
  );
}

export function Component() {
  const rink = useRink();
  const { customerId = '' } = useParams();
  const detail = useCustomer(rink.slug, customerId);
  if (!can(rink, 'customer', 'read')) return <NotFound />;
  if (detail.isPending) return <Loading />;
  if (detail.isError) return detail.error instanceof ApiError && detail.error.status === 404 ? <NotFound message="No such customer at this rink." /> : <Alert>{detail.error.message}</Alert>;
  const { customer, profiles, tickets } = detail.data;
  const unit = rink.unitPreference;
  return (
    <div className="space-y-6">
      <PageHeader
        title={customer.name}
        subtitle={
          <>
            Member code <span className="font-mono font-bold tracking-wider">{customer.memberCode}</span> · {customer.phone ?? '—'} · {customer.email ?? '—'}
            {customer.linked ? ' · has a Rinkwright account' : ''}
          </>
        }
      />
      <Card title="Member code">
        <div className="flex flex-wrap items-center gap-6">
          <MemberQr code={customer.memberCode} />
          <p className="max-w-md text-sm text-ink-soft">The skater can show this code (it is also in their portal); scanning it or typing it in the counter's search finds them at once.</p>
        </div>
      </Card>
      {/* The credits panel is another feature's nested route; the router puts it here. */}
      <Outlet context={{ rink, customer: { id: customer.id, name: customer.name } }} />
      <Card title="Skate profiles">
        <ul className="mb-4 divide-y divide-rule">
          {profiles.map((p) => (
            <ProfileRow key={p.id} slug={rink.slug} customerId={customer.id} unit={unit} profile={p} canEdit={can(rink, 'customer', 'update')} />
          ))}
          {profiles.length === 0 ? <li className="py-2 text-ink-soft">No profile yet.</li> : null}
        </ul>
        {can(rink, 'customer', 'update') ? <ProfileForm slug={rink.slug} customerId={customer.id} unit={unit} /> : null}
      </Card>
      <Card title="Tickets">
        <ul className="divide-y divide-rule">
          {tickets.map((t) => (
            <li key={t.id} className="flex min-h-11 items-center justify-between gap-3 py-1">
              <Link className="font-semibold text-steel underline" to={`/rinks/${rink.slug}/tickets/${t.id}`}>
                Ticket {t.number}
              </Link>
              <span className="text-sm tabular-nums">
                {STATE_WORDS[t.state]} · {formatDateTime(t.droppedAt, rink.timeZone)}
              </span>
            </li>
          ))}
          {tickets.length === 0 ? <li className="py-2 text-ink-soft">No tickets yet.</li> : null}
        </ul>
      </Card>
    </div>
  );
}
