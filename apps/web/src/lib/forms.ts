import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError } from './api-client';

/** Puts an API's per-field messages on the form's fields; returns the message for the form's top line. */
export function applyServerErrors<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>, known: readonly Path<T>[]): string {
  if (!(error instanceof ApiError)) return 'Something went wrong. Try again.';
  let placed = false;
  for (const [field, messages] of Object.entries(error.fields ?? {})) {
    if ((known as readonly string[]).includes(field)) {
      setError(field as Path<T>, { type: 'server', message: messages.join(' ') });
      placed = true;
    }
  }
  return placed ? 'Some fields need attention.' : error.message;
}
