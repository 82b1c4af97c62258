import { useState } from 'react';
import type { FieldValues, UseFormReturn } from 'react-hook-form';
import { applyServerErrors } from '@/lib/form-errors';
import { KeptOnDevice } from '@/lib/offline/kept';

/** What a Care form says after saving: what was kept (a status) and what went wrong (an alert). */
export function SaveOutcome({ kept, alert }: { kept: string | null | undefined; alert: string | null | undefined }) {
  return (
    <>
      {kept ? (
        <p role="status" className="rounded border border-watch-200 bg-watch-50 px-3 py-2 text-base font-semibold text-ink-900">
          {kept}
        </p>
      ) : null}
      {alert ? (
        <p role="alert" className="rounded border border-stop-200 bg-stop-50 px-3 py-2 text-base text-stop-700">
          {alert}
        </p>
      ) : null}
    </>
  );
}

/**
 * A Care form's submit: `save` sends the entry; once stored, `cleared(true)` are the form's next
 * values and `onSaved` gets the answer; once kept on the device (no connection), `cleared(false)`
 * are, so the same entry is not made twice, and `kept` says so; a refusal lands on the fields and
 * in `alert`.
 */
export function useCareSubmit<TForm extends FieldValues, TOut, R>(
  form: UseFormReturn<TForm, unknown, TOut>,
  { fields, save, cleared, onSaved }: { fields: readonly string[]; save: (input: TOut) => Promise<R>; cleared: (stored: boolean) => Partial<TForm>; onSaved: (result: R) => void },
) {
  const [alert, setAlert] = useState<string | null>(null);
  const [kept, setKept] = useState<string | null>(null);
  const submit = form.handleSubmit(async (input) => {
    setAlert(null);
    setKept(null);
    try {
      const result = await save(input);
      form.reset({ ...form.getValues(), ...cleared(true) });
      onSaved(result);
    } catch (error) {
      if (error instanceof KeptOnDevice) {
        form.reset({ ...form.getValues(), ...cleared(false) });
        setKept(error.message);
        return;
      }
      setAlert(applyServerErrors(error, form.setError, fields));
    }
  });
  return { alert, kept, submit };
}
