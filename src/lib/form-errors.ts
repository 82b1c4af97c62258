import { useState } from 'react';
import type { FieldValues, Path, UseFormReturn, UseFormSetError } from 'react-hook-form';
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

/**
 * The form idiom's submit: clears the form's alert, runs `save` with the checked values and, when
 * it fails, puts the server's field messages on `fields` and the rest in `alert`. `close` empties
 * the form (unless `keepValues`) and its alert and calls `onClose` (a dialog's Cancel); `save`
 * gets it too.
 */
export function useFormSubmit<TForm extends FieldValues, TOut>(
  form: UseFormReturn<TForm, unknown, TOut>,
  {
    fields,
    save,
    onClose,
    keepValues = false,
  }: { fields: readonly string[]; save: (values: TOut, close: () => void) => Promise<unknown>; onClose?: () => void; keepValues?: boolean },
) {
  const [alert, setAlert] = useState<string | null>(null);
  const close = () => {
    if (!keepValues) form.reset();
    setAlert(null);
    onClose?.();
  };
  const submit = form.handleSubmit(async (values) => {
    setAlert(null);
    try {
      await save(values, close);
    } catch (error) {
      setAlert(applyServerErrors(error, form.setError, fields));
    }
  });
  return { alert, setAlert, submit, close };
}
