import { CalendarPlus, CircleCheck, ClipboardCheck, LockOpen, OctagonX, Pencil, Plus, Trash2 } from 'lucide-react';
import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { DEFAULT_FLOW_MARGIN_PCT } from '@shared/engine';
import { sanitationKindLabels } from '@shared/schemas/plans';
import type { PlanDto } from '@shared/types/plans';
import { Button, buttonClasses } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ArchiveToggleButton } from '@/components/records/archive-offer';
import { BackLink, RecordLoadFailed } from '@/components/records/record-page';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { Dialog } from '@/components/ui/dialog';
import { EmptyState } from '@/components/ui/empty-state';
import { FormField } from '@/components/ui/form-field';
import { Textarea } from '@/components/ui/input';
import { PageHeader } from '@/components/ui/page-header';
import { LoadingState } from '@/components/ui/states';
import { useToast } from '@/components/ui/toast';
import { paths } from '@/config/paths';
import { ApiError, errorMessage } from '@/lib/api-client';
import { useCan } from '@/lib/session';
import { useUnits } from '@/lib/units';
import { useApprovePlan } from '../api/approve-plan';
import { useDeletePlan } from '../api/delete-plan';
import { usePlan } from '../api/get-plan';
import { useMarkPlanDone } from '../api/mark-plan-done';
import { useReopenPlan } from '../api/reopen-plan';
import { AddLotDialog } from './add-lot-dialog';
import { CartridgeNeeds } from './cartridge-needs';
import { DayTimeline } from './day-timeline';
import { PlanCautions } from './plan-cautions';
import { PlanFormDialog } from './plan-form-dialog';
import { PlanLotSection } from './plan-lot-section';
import { PlanStatusBadge } from './plan-status-badge';
import { dayLabel } from './plans-page';
import { formatDateTime } from '@/lib/dates';

function Facts({ plan }: { plan: PlanDto }) {
  const u = useUnits();
  const items: [string, string][] = [
    ['Date', dayLabel(plan.plannedDate)],
    ['Line', plan.line ? `${plan.line.name} · ${plan.line.bottlesPerHour.toLocaleString()} bottles/h of ${plan.line.bottleMl} mL` : 'none: choose one'],
    ['Flow the filters carry', plan.requiredFlowLh === null ? '—' : `${u.format('flow', plan.requiredFlowLh)} (line + ${DEFAULT_FLOW_MARGIN_PCT} %)`],
    ['Start', `${plan.startTime} · ${sanitationKindLabels[plan.sanitationKind].toLowerCase()} sanitation`],
  ];
  if (plan.approvedAt) items.push(['Approved', `${formatDateTime(plan.approvedAt)}${plan.approvedBy ? ` by ${plan.approvedBy}` : ''}`]);
  return (
    <dl className="grid gap-x-6 gap-y-1 sm:grid-cols-2">
      {items.map(([k, v]) => (
        <div key={k} className="flex items-baseline justify-between gap-3 border-b border-ink-100 py-1.5">
          <dt className="text-sm text-ink-600">{k}</dt>
          <dd className="text-right text-sm font-semibold text-ink-900">{v}</dd>
        </div>
      ))}
    </dl>
  );
}

/** A bottling day: its lots in order with their trains, the day's timeline, cartridges needed and approval. */
export function PlanPage({ planId }: { planId: string }) {
  const plan = usePlan(planId);
  const mayDraft = useCan('plans:draft');
  const mayApprove = useCan('plans:approve');
  const toast = useToast();
  const navigate = useNavigate();
  const approve = useApprovePlan();
  const reopen = useReopenPlan();
  const done = useMarkPlanDone();
  const remove = useDeletePlan();
  const [addingLot, setAddingLot] = useState(false);
  const [editing, setEditing] = useState(false);
  const [deleting, setDeleting] = useState(false);
  const [refused, setRefused] = useState<{ at: string; reasons: string[] } | null>(null);
  const [cautions, setCautions] = useState<string[] | null>(null);
  const [reason, setReason] = useState('');

  const back = <BackLink to={paths.plans}>Plans</BackLink>;
  if (plan.isPending) return <LoadingState />;
  if (plan.isError) return <RecordLoadFailed back={back} notFoundTitle="Plan not found" error={plan.error} onRetry={() => plan.refetch()} />;
  const p = plan.data;
  // A refusal answers the plan as it was; any later change to the plan clears it.
  const refusal = refused && refused.at === p.updatedAt ? refused.reasons : null;
  const setRefusal = (reasons: string[] | null) => setRefused(reasons ? { at: p.updatedAt, reasons } : null);
  const editable = p.status === 'draft' && mayDraft;

  const onApprove = (withReason?: string) =>
    approve.mutate(
      { planId: p.id, reason: withReason },
      {
        onSuccess: () => {
          setRefusal(null);
          setCautions(null);
          setReason('');
          toast.success('Plan approved', 'It is read-only now; reopen it to change it.');
        },
        onError: (e) => {
          if (e instanceof ApiError && e.status === 409 && e.code === 'plan_needs_reason') return setCautions(Object.values(e.fields));
          if (e instanceof ApiError && e.status === 409 && Object.keys(e.fields).length) return setRefusal(Object.values(e.fields));
          toast.error('Not approved', errorMessage(e));
        },
      },
    );

  const actions = (
    <>
      {mayApprove && p.status === 'draft' ? (
        <Button icon={<ClipboardCheck />} loading={approve.isPending} onClick={() => onApprove()}>
          Approve plan
        </Button>
      ) : null}
      {mayApprove && p.status === 'approved' ? (
        <>
          <Button icon={<CircleCheck />} loading={done.isPending} onClick={() => done.mutate(p.id, { onError: (e) => toast.error('Not marked done', errorMessage(e)) })}>
            Mark done
          </Button>
          <Button variant="secondary" icon={<LockOpen />} loading={reopen.isPending} onClick={() => reopen.mutate(p.id, { onError: (e) => toast.error('Not reopened', errorMessage(e)) })}>
            Reopen
          </Button>
        </>
      ) : null}
      {/* The day as a calendar file (.ics) with the winery's time zone. */}
      <a href={`/api/plans/${p.id}/calendar`} download className={buttonClasses('secondary')}>
        <CalendarPlus aria-hidden="true" className="size-4" />
        Add to calendar
      </a>
      {mayDraft ? <ArchiveToggleButton kind="plans" id={p.id} name={p.name} archivedAt={p.archivedAt} /> : null}
      {editable ? (
        <>
          <Button variant="secondary" icon={<Pencil />} onClick={() => setEditing(true)}>
            Edit the day
          </Button>
          <Button variant="secondary" icon={<Trash2 />} onClick={() => setDeleting(true)}>
            Delete
          </Button>
        </>
      ) : null}
    </>
  );

  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        context={back}
        title={
          <span className="flex flex-wrap items-center gap-x-3 gap-y-1">
            <span>{p.name}</span>
            <PlanStatusBadge status={p.status} />
          </span>
        }
        description={p.notes || undefined}
        actions={actions}
      />
      <Facts plan={p} />

      {p.status !== 'draft' ? (
        <p className="text-sm text-ink-700">
          {p.status === 'approved' ? 'Approved plans are read-only. An owner or cellar master can reopen it to change it.' : 'This plan is done; its record stays as it was.'}
          {p.approvalOverride ? (
            <span className="mt-1 block" data-testid="approval-override">
              Approved despite: {p.approvalOverride.cautions.join(' ')} Reason given: “{p.approvalOverride.reason}”
            </span>
          ) : null}
        </p>
      ) : refusal || (mayApprove && p.approvalBlockers.length > 0) ? (
        <div role={refusal ? 'alert' : undefined} className="rounded border border-watch-200 bg-watch-50 px-4 py-3">
          <p className="flex items-center gap-2 text-base font-semibold text-ink-950">
            <OctagonX aria-hidden="true" className="size-5 text-stop-600" />
            {refusal ? 'Not approved yet' : 'Before approval'}
          </p>
          <ul className="mt-1 list-disc pl-6 text-sm text-ink-800">
            {(refusal ?? p.approvalBlockers).map((r) => (
              <li key={r}>{r}</li>
            ))}
          </ul>
        </div>
      ) : null}

      <section aria-labelledby="lots-heading" className="flex flex-col gap-3">
        <div className="flex flex-wrap items-end justify-between gap-2 border-b border-ink-200 pb-2">
          <h2 id="lots-heading" className="text-lg font-semibold text-ink-950">
            Lots in bottling order
          </h2>
          {editable ? (
            <Button icon={<Plus />} onClick={() => setAddingLot(true)}>
              Add lot
            </Button>
          ) : null}
        </div>
        {p.lots.length === 0 ? (
          <EmptyState title="No lots yet" action={editable ? <Button icon={<Plus />} onClick={() => setAddingLot(true)}>Add lot</Button> : null}>
            Add the lots from the cellar in the order they go to the filler. Each gets its own train.
          </EmptyState>
        ) : (
          p.lots.map((l, i) => <PlanLotSection key={l.id} plan={p} planLot={l} editable={editable} isFirst={i === 0} isLast={i === p.lots.length - 1} />)
        )}
      </section>

      <DayTimeline plan={p} />
      <CartridgeNeeds plan={p} />
      <Card title="Safety on the day" level={2}>
        <PlanCautions sanitationKind={p.sanitationKind} />
      </Card>

      <Dialog
        open={cautions !== null}
        onClose={() => setCautions(null)}
        title="Approve with a written reason?"
        description="These are not broken ratings, but they need a reason that stays with the approval."
        footer={
          <>
            <Button variant="secondary" onClick={() => setCautions(null)}>
              Back to the plan
            </Button>
            <Button icon={<ClipboardCheck />} loading={approve.isPending} disabled={reason.trim() === ''} onClick={() => onApprove(reason.trim())}>
              Approve with this reason
            </Button>
          </>
        }
      >
        <ul className="mb-3 list-disc pl-6 text-sm text-ink-800" aria-label="Cautions">
          {(cautions ?? []).map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
        <FormField label="Reason for approving anyway" htmlFor="approval-reason">
          <Textarea id="approval-reason" rows={3} value={reason} onChange={(e) => setReason(e.target.value)} maxLength={1000} />
        </FormField>
      </Dialog>
      <AddLotDialog plan={p} open={addingLot} onClose={() => setAddingLot(false)} />
      <PlanFormDialog open={editing} plan={p} onClose={() => setEditing(false)} />
      <ConfirmDialog
        open={deleting}
        onClose={() => setDeleting(false)}
        title={`Delete ${p.name}?`}
        description="The draft, its lots and trains go. The lots stay in the cellar."
        cancelLabel="Cancel"
        confirmLabel="Delete plan"
        pending={remove.isPending}
        onConfirm={() =>
          remove.mutate(p.id, {
            onSuccess: () => navigate(paths.plans),
            onError: (e) => toast.error('Not deleted', errorMessage(e)),
          })
        }
      />
    </div>
  );
}
