import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError } from '../../../lib/api-client';
import { applyServerErrors } from '../../../lib/forms';

/** The form's top line after a refused or lost write; a lost one is safe to send again with the same key. */
export function upkeepProblem<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>, known: readonly Path<T>[]): string {
  const text = applyServerErrors(error, setError, known);
  const lost = error instanceof ApiError && (error.code === 'network' || error.status >= 500);
  return lost ? `${text} Send it again: it will be logged once, however often you press.` : text;
}
