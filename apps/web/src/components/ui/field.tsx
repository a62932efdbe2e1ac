import { forwardRef, useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes } from 'react';

const control =
  'mt-1 block min-h-11 w-full rounded-lg border border-rule bg-white px-3 text-base text-ink placeholder:text-ink-soft/60 aria-[invalid=true]:border-brick';

interface FieldProps {
  label: string;
  error?: string | undefined;
  hint?: ReactNode;
}

/** Label, control and one line under it (the error when there is one, else the hint), wired for screen readers. */
function Field({ label, error, hint, className, children }: FieldProps & { className: string; children: (a11y: Record<string, unknown>) => ReactNode }) {
  const id = useId();
  const messageId = `${id}-msg`;
  return (
    <div className={className}>
      <label htmlFor={id} className="block text-sm font-semibold">
        {label}
      </label>
      {children({ id, className: control, 'aria-invalid': error ? true : undefined, 'aria-describedby': error || hint ? messageId : undefined })}
      {error ? (
        <p id={messageId} className="mt-1 text-sm font-medium text-brick" role="alert">
          {error}
        </p>
      ) : hint ? (
        <p id={messageId} className="mt-1 text-sm text-ink-soft">
          {hint}
        </p>
      ) : null}
    </div>
  );
}

export const TextField = forwardRef<HTMLInputElement, FieldProps & InputHTMLAttributes<HTMLInputElement>>(function TextField(
  { label, error, hint, className = '', ...rest },
  ref,
) {
  return (
    <Field label={label} error={error} hint={hint} className={className}>
      {(a11y) => <input ref={ref} {...a11y} {...rest} />}
    </Field>
  );
});

export const SelectField = forwardRef<HTMLSelectElement, FieldProps & SelectHTMLAttributes<HTMLSelectElement> & { options: { value: string; label: string }[] }>(
  function SelectField({ label, error, hint, options, className = '', ...rest }, ref) {
    return (
      <Field label={label} error={error} hint={hint} className={className}>
        {(a11y) => (
          <select ref={ref} {...a11y} {...rest}>
            {options.map((o) => (
              <option key={o.value} value={o.value}>
                {o.label}
              </option>
            ))}
          </select>
        )}
      </Field>
    );
  },
);
