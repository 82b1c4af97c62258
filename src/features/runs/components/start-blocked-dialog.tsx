import { useState } from 'react';
import { Link } from 'react-router-dom';
import { overridableBlockCodes, OVERRIDE_REASON_MAX } from '@shared/schemas/runs';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormField } from '@/components/ui/form-field';
import { Textarea } from '@/components/ui/input';
import { FormMessage } from '@/components/ui/form-message';
import { paths } from '@/config/paths';
import { ApiError, errorMessage } from '@/lib/api-client';
import { useCan } from '@/lib/session';
import { usePlanWithInstalled } from '../api/start-check';
import { useStartRun } from '../api/start-run';

export type BlockReason = { stageIndex: number; code: string; message: string };

const isOverridable = (code: string) => (overridableBlockCodes as readonly string[]).includes(code);

/** What to do about a reason, as a link or an action, beside the reason's own words. */
function WhatToDo({ reason, planLotId, onPlanned }: { reason: BlockReason; planLotId: string; onPlanned: (reasons: BlockReason[]) => void }) {
  const mayReplan = useCan('plans:approve');
  const replan = usePlanWithInstalled();
  const [error, setError] = useState<string | null>(null);
  const install = (
    <Link className="font-semibold text-brand-700 underline" to={paths.cartridges}>
      Install the planned cartridges
    </Link>
  );
  switch (reason.code) {
    case 'type_mismatch':
      return (
        <div className="flex flex-col gap-2">
          <div className="flex flex-wrap items-center gap-3">
            {mayReplan ? (
              <Button
                size="sm"
                variant="secondary"
                disabled={replan.isPending}
                onClick={() =>
                  replan.mutate(
                    { planLotId, stageIndex: reason.stageIndex },
                    { onSuccess: (check) => onPlanned(check.reasons), onError: (e) => setError(errorMessage(e)) },
                  )
                }
              >
                Plan with what is installed
              </Button>
            ) : null}
            {install}
          </div>
          <FormMessage message={error} />
        </div>
      );
    case 'housing_empty':
    case 'housing_partial':
    case 'cartridge_retired':
    case 'cartridge_spent':
      return install;
    case 'integrity_failed':
      return (
        <Link className="font-semibold text-brand-700 underline" to={paths.care}>
          Re-test on the Care page
        </Link>
      );
    default:
      return (
        <Link className="font-semibold text-brand-700 underline" to={paths.plans}>
          Change the train in the plan
        </Link>
      );
  }
}

/**
 * Why a run cannot start, one reason per problem with what to do; for a cellar master or
 * owner, a written reason to start anyway when every problem may be overridden.
 */
export function StartBlockedDialog({
  planLotId,
  reasons: initial,
  onClose,
  onStarted,
}: {
  planLotId: string;
  reasons: BlockReason[];
  onClose: () => void;
  onStarted: (runId: string) => void;
}) {
  const [reasons, setReasons] = useState(initial);
  const [why, setWhy] = useState('');
  const [fieldError, setFieldError] = useState<string | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const mayOverride = useCan('plans:approve');
  const start = useStartRun();
  const allOverridable = reasons.length > 0 && reasons.every((r) => isOverridable(r.code));

  function startRun(override?: { reason: string }) {
    setFormError(null);
    setFieldError(null);
    start.mutate(
      { planLotId, override },
      {
        onSuccess: (run) => onStarted(run.id),
        onError: (e) => {
          if (e instanceof ApiError && e.code === 'run_blocked' && e.body?.reasons) setReasons(e.body.reasons);
          if (e instanceof ApiError && e.fields['override.reason']) setFieldError(e.fields['override.reason']);
          else setFormError(errorMessage(e));
        },
      },
    );
  }

  return (
    <Dialog
      open
      onClose={onClose}
      size="lg"
      title={reasons.length ? 'The run cannot start yet' : 'Ready to start'}
      description={
        reasons.length
          ? 'What is in the housings does not match the plan. Each problem says what to do.'
          : 'The housings now hold what the plan asks for.'
      }
      footer={
        <>
          <Button variant="ghost" onClick={onClose}>
            Not now
          </Button>
          {reasons.length === 0 ? (
            <Button disabled={start.isPending} onClick={() => startRun()}>
              Start run
            </Button>
          ) : null}
        </>
      }
    >
      <div className="flex flex-col gap-4">
        <FormMessage message={formError} />
        {reasons.length > 0 ? (
          <ul className="flex flex-col gap-3" aria-label="Why the run cannot start">
            {reasons.map((r) => (
              <li key={`${String(r.stageIndex)}-${r.code}-${r.message}`} className="flex flex-col gap-2 rounded-md border border-ink-200 p-3">
                <p className="text-sm font-semibold uppercase tracking-wide text-ink-600">
                  Stage {r.stageIndex + 1} · {isOverridable(r.code) ? 'may be overridden with a reason' : 'must be fixed'}
                </p>
                <p className="text-base text-ink-900">{r.message}</p>
                <WhatToDo reason={r} planLotId={planLotId} onPlanned={setReasons} />
              </li>
            ))}
          </ul>
        ) : null}
        {reasons.length > 0 && allOverridable && mayOverride ? (
          <div className="flex flex-col gap-3 rounded-md border border-watch-200 p-3">
            <FormField
              label="Start anyway: why?"
              htmlFor="override-reason"
              hint="Kept on the run and printed on the lot’s record, with your name."
              error={fieldError}
              required
            >
              <Textarea id="override-reason" rows={3} maxLength={OVERRIDE_REASON_MAX} value={why} onChange={(e) => setWhy(e.target.value)} />
            </FormField>
            <div>
              <Button
                variant="danger"
                disabled={start.isPending}
                onClick={() => {
                  if (why.trim().length < 3) setFieldError('Write why the run starts anyway (a few words at least).');
                  else startRun({ reason: why });
                }}
              >
                Start with this reason
              </Button>
            </div>
          </div>
        ) : reasons.length > 0 && allOverridable ? (
          <p className="text-base text-ink-700">A cellar master or the owner may start anyway with a written reason.</p>
        ) : null}
      </div>
    </Dialog>
  );
}
