import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { leagueInput, type LeagueDetail, type LeagueInput, type RinkSummary } from '@rinkwright/core';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { SelectField, TextField } from '../../../components/ui/field';
import { applyServerErrors } from '../../../lib/forms';
import { can } from '../../../lib/rink-context';
import { useCreateLeague } from '../api/create-league';
import { useStaff } from '../api/get-staff';

interface Values {
  name: string;
  season: string;
  managerUserId: string;
}

const schema = z
  .object({ name: z.string(), season: z.string(), managerUserId: z.string() })
  .transform((v): z.input<typeof leagueInput> => ({ name: v.name, season: v.season.trim() === '' ? null : v.season, managerUserId: v.managerUserId || null }))
  .pipe(leagueInput);

export function LeagueForm({ rink, onAdded }: { rink: RinkSummary; onAdded: (league: LeagueDetail) => void }) {
  const create = useCreateLeague(rink.slug);
  const seesStaff = can(rink, 'member', 'read');
  const staff = useStaff(rink.slug, seesStaff);
  const [problem, setProblem] = useState('');
  const { register, handleSubmit, formState, setError, reset } = useForm<Values, unknown, LeagueInput>({
    resolver: zodResolver(schema),
    defaultValues: { name: '', season: '', managerUserId: '' },
  });
  const e = formState.errors;
  const managers = (staff.data?.members ?? []).filter((m) => m.role === 'league_manager');
  const onSubmit = handleSubmit(async (input) => {
    setProblem('');
    try {
      const added = await create.mutateAsync(input);
      reset();
      onAdded(added);
    } catch (error) {
      setProblem(applyServerErrors(error, setError, ['name', 'season', 'managerUserId']));
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Add a league">
      <Alert>{problem}</Alert>
      <TextField label="League name" autoComplete="off" error={e.name?.message} {...register('name')} />
      <TextField label="Season (optional)" autoComplete="off" placeholder="e.g. Winter" error={e.season?.message} {...register('season')} />
      {seesStaff ? (
        <SelectField
          label="League manager (optional)"
          hint={staff.isSuccess && managers.length === 0 ? 'Nobody has the league manager role yet: invite one under Staff.' : 'They see and run this league only.'}
          options={[{ value: '', label: 'No league manager' }, ...managers.map((m) => ({ value: m.userId, label: `${m.name} (${m.email})` }))]}
          error={e.managerUserId?.message}
          {...register('managerUserId')}
        />
      ) : null}
      <Button type="submit" busy={formState.isSubmitting}>
        {formState.isSubmitting ? 'Adding…' : 'Add league'}
      </Button>
    </form>
  );
}
