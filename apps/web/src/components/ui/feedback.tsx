import type { ReactNode } from 'react';

export function Alert({ tone = 'error', children }: { tone?: 'error' | 'info' | 'success'; children: ReactNode }) {
  if (!children) return null;
  const styles = {
    error: 'border-brick bg-red-50 text-brick',
    info: 'border-steel bg-glacier text-ink',
    success: 'border-steel bg-white text-ink',
  }[tone];
  return (
    <div role={tone === 'error' ? 'alert' : 'status'} className={`rounded-lg border-l-4 px-4 py-3 text-sm font-medium ${styles}`}>
      {children}
    </div>
  );
}

export function Loading({ label = 'Loading…' }: { label?: string }) {
  return (
    <p role="status" className="py-8 text-center text-ink-soft">
      {label}
    </p>
  );
}
