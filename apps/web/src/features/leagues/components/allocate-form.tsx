import { useState } from 'react';
import { allocationInput, type TeamRow } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { SelectField, TextField } from '../../../components/ui/field';
import { ApiError } from '../../../lib/api-client';
import { formatCount } from '../../../lib/format';
import { useAllocate } from '../api/allocate';

/** Gives pool credits to one team (shared by its players at the counter) or to one player's own account. */
export function AllocateForm({ slug, leagueId, teams, pool }: { slug: string; leagueId: string; teams: TeamRow[]; pool: number }) {
  const allocate = useAllocate(slug, leagueId);
  const [target, setTarget] = useState('');
  const [credits, setCredits] = useState('');
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [note, setNote] = useState<{ tone: 'error' | 'success' | 'info'; text: string } | null>(null);
  const [kind, targetId = ''] = target.split(':');
  const targetName = kind === 'team' ? teams.find((t) => t.id === targetId)?.name : teams.flatMap((t) => t.players).find((p) => p.id === targetId)?.name;

  async function submit() {
    setNote(null);
    const parsed = allocationInput.safeParse({
      teamId: kind === 'team' ? targetId : null,
      playerId: kind === 'player' ? targetId : null,
      credits: credits.trim() === '' ? Number.NaN : Number(credits),
    });
    if (!parsed.success) {
      const fields: Record<string, string[]> = {};
      for (const i of parsed.error.issues) (fields[String(i.path[0] ?? 'teamId')] ??= []).push(i.message);
      setErrors(fields);
      return;
    }
    setErrors({});
    try {
      const outcome = await allocate.mutateAsync({ input: parsed.data, label: `${parsed.data.credits} credits to ${targetName ?? 'a league member'}` });
      setCredits('');
      setNote(
        outcome.queued
          ? { tone: 'info', text: 'Saved on this tablet: the credits move as soon as the connection is back.' }
          : { tone: 'success', text: `${parsed.data.credits} credit${parsed.data.credits === 1 ? '' : 's'} given to ${targetName ?? 'them'}.` },
      );
    } catch (error) {
      if (error instanceof ApiError && error.fields) setErrors(error.fields);
      setNote({ tone: 'error', text: error instanceof Error ? error.message : 'Not allocated' });
    }
  }

  const targetError = [...(errors.teamId ?? []), ...(errors.playerId ?? [])].join(' ');
  return (
    <form className="space-y-3" aria-label="Allocate credits" noValidate onSubmit={(e) => (e.preventDefault(), void submit())}>
      <p className="text-sm text-ink-soft tabular-nums">{formatCount(pool)} credit{pool === 1 ? '' : 's'} in the pool to give out. Team credits are shared by its players at the counter; a player's own credits are theirs alone.</p>
      {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
      <SelectField
        label="To"
        value={target}
        onChange={(e) => setTarget(e.target.value)}
        error={targetError || undefined}
        options={[
          { value: '', label: 'Choose a team or a player' },
          ...teams.flatMap((t) => [
            { value: `team:${t.id}`, label: `Team ${t.name} (shared)` },
            ...t.players.map((p) => ({ value: `player:${p.id}`, label: `${p.name}, ${t.name} (own credits)` })),
          ]),
        ]}
      />
      <TextField label="Credits" inputMode="numeric" className="tabular-nums" value={credits} onChange={(e) => setCredits(e.target.value)} error={errors.credits?.join(' ')} />
      {/* An explicit disabled wins over busy in Button: the pending state is folded in, or a second press would move credits twice. */}
      <Button type="submit" busy={allocate.isPending} disabled={allocate.isPending || teams.length === 0}>
        {allocate.isPending ? 'Allocating…' : 'Allocate credits'}
      </Button>
    </form>
  );
}
