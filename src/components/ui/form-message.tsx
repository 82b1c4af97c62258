/** A form's message that is not about one field (e.g. the server's refusal), shown above the fields. */
export function FormMessage({ message }: { message: string | null | undefined }) {
  if (!message) return null;
  return (
    <p role="alert" className="text-sm font-semibold text-stop-700">
      {message}
    </p>
  );
}
