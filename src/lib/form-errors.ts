import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError } from './api-client';

/**
 * Puts server-side field errors next to their fields; returns the message to show
 * for anything that is not about one field.
 */
export function applyServerErrors<T extends FieldValues>(err: unknown, setError: UseFormSetError<T>, fields: Array<Path<T>>): string | null {
  if (!(err instanceof ApiError)) return 'Something went wrong. Try again.';
  const byField = err.fieldErrors;
  let placed = false;
  for (const f of fields) {
    if (byField[f]) {
      setError(f, { type: 'server', message: byField[f] });
      placed = true;
    }
  }
  return placed ? null : err.message;
}
