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
