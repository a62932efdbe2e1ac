import { useState } from 'react';
import { Button } from '../../../components/ui/button';

/** Long lists open with the latest few, so a phone is not pages of scrolling; one press shows the rest. */
export function useShowMore<T>(items: T[], first: number) {
  const [open, setOpen] = useState(false);
  return { shown: open ? items : items.slice(0, first), open, toggle: () => setOpen((o) => !o), hidden: Math.max(0, items.length - first) };
}

export function ShowMoreButton({ open, hidden, first, noun, onToggle }: { open: boolean; hidden: number; first: number; noun: readonly [one: string, many: string]; onToggle: () => void }) {
  if (hidden === 0) return null;
  return (
    <Button tone="secondary" aria-expanded={open} onClick={onToggle} className="tabular-nums">
      {open ? `Show the latest ${first} only` : `Show ${hidden} more ${hidden === 1 ? noun[0] : noun[1]}`}
    </Button>
  );
}
