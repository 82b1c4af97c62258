import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError, errorMessage } from './api-client';

/**
 * Puts the server's field messages beside the matching fields; returns the message to show
 * above the form for anything that is not about one field.
 */
export function applyServerErrors<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>, fieldNames: readonly string[]): string | null {
  if (!(error instanceof ApiError)) return errorMessage(error);
  let placed = false;
  for (const [field, message] of Object.entries(error.fields)) {
    if (fieldNames.includes(field)) {
      setError(field as Path<T>, { type: 'server', message });
      placed = true;
    }
  }
  return placed && error.code === 'invalid_input' ? null : error.message;
}
