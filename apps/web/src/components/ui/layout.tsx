import type { ReactNode } from 'react';

export function PageHeader({ title, subtitle, actions }: { title: string; subtitle?: ReactNode; actions?: ReactNode }) {
  return (
    <header className="mb-6 flex flex-wrap items-end justify-between gap-4">
      <div>
        <h1 className="text-2xl font-extrabold tracking-tight sm:text-3xl">{title}</h1>
        {subtitle ? <p className="mt-1 text-ink-soft">{subtitle}</p> : null}
      </div>
      {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
    </header>
  );
}

export function Card({ title, children, className = '' }: { title?: string; children: ReactNode; className?: string }) {
  return (
    <section className={`rounded-xl border border-rule bg-white p-5 shadow-sm ${className}`} aria-label={title}>
      {title ? <h2 className="mb-4 text-lg font-bold">{title}</h2> : null}
      {children}
    </section>
  );
}

export function Stat({ label, value }: { label: string; value: ReactNode }) {
  return (
    <div className="rounded-lg bg-glacier px-4 py-3">
      <dt className="text-sm font-medium text-ink-soft">{label}</dt>
      <dd className="mt-1 text-2xl font-bold tabular-nums">{value}</dd>
    </div>
  );
}

/** A centred single-card page, for sign-in and the other account screens. */
export function NarrowPage({ title, children, footer }: { title: string; children: ReactNode; footer?: ReactNode }) {
  return (
    <div className="mx-auto w-full max-w-md px-4 py-10">
      <div className="rounded-2xl border border-rule bg-white p-6 shadow-sm sm:p-8">
        <h1 className="mb-6 text-2xl font-extrabold tracking-tight">{title}</h1>
        {children}
      </div>
      {footer ? <div className="mt-4 text-center text-sm text-ink-soft">{footer}</div> : null}
    </div>
  );
}
