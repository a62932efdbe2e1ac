import type { ButtonHTMLAttributes } from 'react';
import { Link, type LinkProps } from 'react-router';

type Tone = 'primary' | 'secondary' | 'danger' | 'quiet';

const base =
  'inline-flex min-h-11 items-center justify-center gap-2 rounded-lg px-4 text-sm font-semibold transition-colors disabled:cursor-not-allowed disabled:opacity-60';
const tones: Record<Tone, string> = {
  primary: 'bg-steel text-white hover:bg-steel-dark',
  secondary: 'border border-rule bg-white text-ink hover:bg-glacier',
  danger: 'border border-brick bg-white text-brick hover:bg-red-50',
  quiet: 'text-steel hover:bg-glacier',
};

export function buttonClass(tone: Tone = 'primary', extra = ''): string {
  return `${base} ${tones[tone]} ${extra}`;
}

export function Button({ tone = 'primary', busy, children, className = '', ...rest }: ButtonHTMLAttributes<HTMLButtonElement> & { tone?: Tone; busy?: boolean }) {
  return (
    <button type="button" className={buttonClass(tone, className)} aria-busy={busy || undefined} {...rest} disabled={busy || rest.disabled}>
      {children}
    </button>
  );
}

export function LinkButton({ tone = 'primary', className = '', ...rest }: LinkProps & { tone?: Tone }) {
  return <Link className={buttonClass(tone, className)} {...rest} />;
}
