import { CircleExclamationPoint } from 'lucide-react';

/** A message above a form for what is not about one field. */
export function FormAlert({ message }: { message: string | null }) {
  if (!message) return null;
  return (
    <div role="alert" className="flex items-start gap-2 rounded-md border border-stop-200 bg-stop-50 px-3 py-2 text-sm text-stop-800">
      <CircleExclamationPoint aria-hidden="true" className="mt-0.5 size-4 shrink-0" />
      <span>{message}</span>
    </div>
  );
}
