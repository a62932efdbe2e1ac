import type { PlatformRinkRow } from '@rinkwright/core';
import { formatDate } from '../../../lib/format';

type Plan = PlatformRinkRow['plan'];
type Tone = 'good' | 'watch' | 'stopped' | 'none';

const TONE: Record<Tone, string> = {
  good: 'border-steel text-steel-dark',
  watch: 'border-amber bg-amber-50 text-ink',
  stopped: 'border-brick bg-red-50 text-brick',
  none: 'border-rule text-ink-soft',
};

/** A plan's state in words, with what follows from it: the badge's colour only repeats what the words say. */
export function planWords(plan: Plan, timeZone: string): { label: string; detail: string | null; tone: Tone } {
  const until = plan.graceUntil ? formatDate(plan.graceUntil, timeZone) : null;
  switch (plan.state) {
    case 'active':
      return { label: 'Active', detail: null, tone: 'good' };
    // The API already answers read_only for a past_due plan whose grace has run out.
    case 'past_due':
      return { label: 'In grace', detail: until ? `Payment failed; read-only after ${until}` : 'Payment failed', tone: 'watch' };
    case 'read_only':
      return { label: 'Read-only', detail: 'Unpaid plan', tone: 'stopped' };
    case 'canceled':
      return { label: 'Cancelled', detail: null, tone: 'none' };
    case 'none':
      return { label: 'No plan', detail: 'Not subscribed yet', tone: 'none' };
  }
}

export function Badge({ tone, children }: { tone: Tone; children: string }) {
  return <span className={`inline-flex items-center whitespace-nowrap rounded-full border-2 px-3 py-0.5 text-xs font-bold ${TONE[tone]}`}>{children}</span>;
}

export function PlanState({ plan, timeZone }: { plan: Plan; timeZone: string }) {
  const words = planWords(plan, timeZone);
  return (
    <span className="inline-flex flex-col items-start gap-1">
      <Badge tone={words.tone}>{words.label}</Badge>
      {words.detail ? <span className="text-xs text-ink-soft">{words.detail}</span> : null}
    </span>
  );
}
