import { forwardRef, useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes } from 'react';

const control =
  'mt-1 block min-h-11 w-full rounded-lg border bg-white px-3 text-base text-ink placeholder:text-ink-soft/60 aria-[invalid=true]:border-brick';

interface FieldProps {
  label: string;
  error?: string | undefined;
  hint?: ReactNode;
}

function Message({ id, error, hint }: { id: string; error?: string | undefined; hint?: ReactNode }) {
  if (error) {
    return (
      <p id={id} className="mt-1 text-sm font-medium text-brick" role="alert">
        {error}
      </p>
    );
  }
  return hint ? (
    <p id={id} className="mt-1 text-sm text-ink-soft">
      {hint}
    </p>
  ) : null;
}

export const TextField = forwardRef<HTMLInputElement, FieldProps & InputHTMLAttributes<HTMLInputElement>>(function TextField(
  { label, error, hint, className = '', ...rest },
  ref,
) {
  const id = useId();
  return (
    <div className={className}>
      <label htmlFor={id} className="block text-sm font-semibold">
        {label}
      </label>
      <input
        ref={ref}
        id={id}
        className={`${control} border-rule`}
        aria-invalid={error ? true : undefined}
        aria-describedby={error || hint ? `${id}-msg` : undefined}
        {...rest}
      />
      <Message id={`${id}-msg`} error={error} hint={hint} />
    </div>
  );
});

export const SelectField = forwardRef<HTMLSelectElement, FieldProps & SelectHTMLAttributes<HTMLSelectElement> & { options: { value: string; label: string }[] }>(
  function SelectField({ label, error, hint, options, className = '', ...rest }, ref) {
    const id = useId();
    return (
      <div className={className}>
        <label htmlFor={id} className="block text-sm font-semibold">
          {label}
        </label>
        <select
          ref={ref}
          id={id}
          className={`${control} border-rule`}
          aria-invalid={error ? true : undefined}
          aria-describedby={error || hint ? `${id}-msg` : undefined}
          {...rest}
        >
          {options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
        <Message id={`${id}-msg`} error={error} hint={hint} />
      </div>
    );
  },
);
