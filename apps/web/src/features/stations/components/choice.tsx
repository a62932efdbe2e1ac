import { forwardRef, useId, type InputHTMLAttributes, type ReactNode } from 'react';

// Checkboxes and radio buttons with the whole line as the touch target (44 px tall), and the error or hint
// wired to the control as the text fields do it.

type ChoiceProps = Omit<InputHTMLAttributes<HTMLInputElement>, 'type'> & {
  label: ReactNode;
  hint?: ReactNode;
  error?: string | undefined;
  type?: 'checkbox' | 'radio';
};

export const Choice = forwardRef<HTMLInputElement, ChoiceProps>(function Choice({ label, hint, error, type = 'checkbox', className = '', ...rest }, ref) {
  const id = useId();
  const messageId = `${id}-msg`;
  return (
    <div className={className}>
      <label htmlFor={id} className="flex min-h-11 cursor-pointer items-center gap-3 rounded-lg py-1 text-sm font-semibold">
        <input
          ref={ref}
          id={id}
          type={type}
          className="size-5 shrink-0 accent-steel"
          aria-invalid={error ? true : undefined}
          aria-describedby={error || hint ? messageId : undefined}
          {...rest}
        />
        <span>{label}</span>
      </label>
      {error ? (
        <p id={messageId} role="alert" className="ml-8 text-sm font-medium text-brick">
          {error}
        </p>
      ) : hint ? (
        <p id={messageId} className="ml-8 text-sm text-ink-soft">
          {hint}
        </p>
      ) : null}
    </div>
  );
});
