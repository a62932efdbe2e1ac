import { useState } from 'react';
import type { StationRow } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { ApiError } from '../../../lib/api-client';
import { useActionKey } from '../api/idempotency';
import { useRemoveWheel } from '../api/remove-wheel';

export function RemoveWheelButton({ slug, station }: { slug: string; station: StationRow }) {
  const remove = useRemoveWheel(slug, station.id);
  const actionKey = useActionKey();
  const [problem, setProblem] = useState('');
  if (!station.wheel) return null;
  const wheel = station.wheel;
  const onRemove = async () => {
    if (!window.confirm(`Log ${wheel.label} as removed from ${station.name}? The station has no wheel until one is mounted.`)) return;
    setProblem('');
    try {
      await remove.mutateAsync({ key: actionKey.keyFor({ removal: wheel.id }) });
      actionKey.settle();
    } catch (error) {
      setProblem(error instanceof ApiError ? error.message : 'That did not work. Try again.');
    }
  };
  return (
    <div className="space-y-2">
      {problem ? <Alert>{problem}</Alert> : null}
      <Button tone="danger" busy={remove.isPending} onClick={() => void onRemove()}>
        {remove.isPending ? 'Removing…' : 'Log wheel removed'}
      </Button>
    </div>
  );
}
