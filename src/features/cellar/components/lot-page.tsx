import { FlaskConical, Pencil, Plus, Trash2 } from 'lucide-react';
import { useCallback, useState, type ReactNode } from 'react';
import { useNavigate } from 'react-router-dom';
import { wineStyleLabels } from '@shared/schemas/cellar';
import type { LabResultDto, LotDto } from '@shared/types/cellar';
import { AttachmentPanel } from '@/components/attachments/attachment-panel';
import { BackLink, RecordLoadFailed } from '@/components/records/record-page';
import { ArchiveOffer, ArchiveToggleButton, isInRecord } from '@/components/records/archive-offer';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { Dialog } from '@/components/ui/dialog';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { useToast } from '@/components/ui/toast';
import { lazyChart } from '@/components/ui/lazy-chart';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api-client';
import { useCan } from '@/lib/session';
import { useDeleteLabResult } from '../api/delete-lab-result';
import { useDeleteLot } from '../api/delete-lot';
import { useLabResults } from '../api/get-lab-results';
import { useLot } from '../api/get-lot';
import { LabResultFormDialog } from './lab-result-form-dialog';
import { LabResultsTable } from './lab-results-table';
import { LotFormDialog } from './lot-form-dialog';
import { FixedQuantity, MetricQuantity } from './metric-quantity';
import { ReadinessBadge } from '@/components/status/readiness-badge';
import { ReadinessPanel } from './readiness-panel';
import { formatDate, formatDateTime } from '@/lib/dates';

/** The lab results chart (`./lab-results-chart`), loaded after the page paints. */
const LabResultsChart = lazyChart(
  () => import('./lab-results-chart').then((m) => m.LabResultsChart),
  () => 'h-72',
);

function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="flex items-baseline justify-between gap-3 border-b border-ink-100 py-1.5 last:border-0">
      <dt className="text-sm text-ink-600">{label}</dt>
      <dd className="text-right text-base font-semibold text-ink-900">{children}</dd>
    </div>
  );
}

function LotFacts({ lot }: { lot: LotDto }) {
  return (
    <Card title="Facts">
      <dl>
        <Fact label="Style">{wineStyleLabels[lot.style]}</Fact>
        <Fact label="Vintage">{lot.vintage ?? 'Non-vintage'}</Fact>
        <Fact label="Volume">
          <MetricQuantity kind="volume" value={lot.volumeL} />
        </Fact>
        <Fact label="Tank">{lot.tank?.name ?? <span className="font-normal text-ink-500">none</span>}</Fact>
        <Fact label="Alcohol">
          <FixedQuantity value={lot.ethanolPctVol} unit="% vol" digits={1} />
        </Fact>
        <Fact label="Residual sugar">
          <FixedQuantity value={lot.sugarGPerL} unit="g/L" digits={1} />
        </Fact>
        <Fact label="Temperature at filtration">
          <MetricQuantity kind="temperature" value={lot.tempC} />
        </Fact>
        <Fact label="Latest sample">
          {lot.latestLabResult ? <span className="num">{formatDate(lot.latestLabResult.sampledAt)}</span> : <span className="font-normal text-ink-500">none yet</span>}
        </Fact>
      </dl>
      {lot.notes ? <p className="mt-3 text-sm whitespace-pre-line text-ink-700">{lot.notes}</p> : null}
    </Card>
  );
}

/** A lot: readiness with reasons and thresholds, facts, lab results over time, files. */
export function LotPage({ lotId }: { lotId: string }) {
  const lot = useLot(lotId);
  const results = useLabResults(lotId);
  const mayEditLot = useCan('cellar:edit');
  const mayEditResults = useCan('lab-results:edit');
  const mayDelete = useCan('records:delete');
  const deleteLot = useDeleteLot();
  const deleteResult = useDeleteLabResult();
  const toast = useToast();
  const navigate = useNavigate();
  const [editingLot, setEditingLot] = useState(false);
  const [deletingLot, setDeletingLot] = useState(false);
  const [lotRefusal, setLotRefusal] = useState<string | null>(null);
  const [resultForm, setResultForm] = useState<{ open: boolean; result: LabResultDto | null }>({ open: false, result: null });
  const [deletingResult, setDeletingResult] = useState<LabResultDto | null>(null);

  const onEditResult = useCallback((r: LabResultDto) => setResultForm({ open: true, result: r }), []);
  const onDeleteResult = useCallback((r: LabResultDto) => setDeletingResult(r), []);

  const back = <BackLink to={paths.cellar}>Cellar</BackLink>;

  if (lot.isPending) return <LoadingState />;
  if (lot.isError) return <RecordLoadFailed back={back} notFoundTitle="Lot not found" error={lot.error} onRetry={() => lot.refetch()} />;
  const l = lot.data;
  const addResult = mayEditResults ? (
    <Button icon={<Plus aria-hidden="true" className="size-4" />} onClick={() => setResultForm({ open: true, result: null })}>
      Add lab result
    </Button>
  ) : null;

  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        context={back}
        title={
          <span className="flex flex-wrap items-center gap-x-3 gap-y-1">
            <span>
              {l.code} · {l.name}
            </span>
            <ReadinessBadge verdict={l.readiness.verdict} />
          </span>
        }
        description={`${wineStyleLabels[l.style]}${l.vintage ? `, ${l.vintage}` : ', non-vintage'}${l.tank ? ` · in ${l.tank.name}` : ''}`}
        actions={
          <>
            {addResult}
            {mayEditLot ? (
              <>
                <Button variant="secondary" icon={<Pencil aria-hidden="true" className="size-4" />} onClick={() => setEditingLot(true)}>
                  Edit lot
                </Button>
                <ArchiveToggleButton kind="lots" id={l.id} name={l.code} archivedAt={l.archivedAt} />
                {mayDelete ? (
                  <Button variant="secondary" icon={<Trash2 aria-hidden="true" className="size-4" />} onClick={() => setDeletingLot(true)}>
                    Delete lot
                  </Button>
                ) : null}
              </>
            ) : null}
          </>
        }
      />

      <div className="grid gap-6 lg:grid-cols-3">
        <div className="lg:col-span-2">
          <ReadinessPanel lot={l} />
        </div>
        <LotFacts lot={l} />
      </div>

      <Card title="Lab results" description="Turbidity, clogging test, Vmax disc test and free SO₂ over time.">
        {results.isPending ? (
          <LoadingState variant="skeleton" />
        ) : results.isError ? (
          <ErrorState message={errorMessage(results.error)} onRetry={() => results.refetch()} />
        ) : results.data.items.length === 0 ? (
          <EmptyState icon={<FlaskConical />} title="No lab results yet" action={addResult}>
            Add the lab’s turbidity and clogging test (times to 200 and 400 mL) to get a readiness verdict for this lot.
          </EmptyState>
        ) : (
          <div className="flex flex-col gap-4">
            <LabResultsChart results={results.data.items} thresholds={l.thresholds} />
            <LabResultsTable results={results.data.items} mayEdit={mayEditResults} mayDelete={mayDelete} onEdit={onEditResult} onDelete={onDeleteResult} />
          </div>
        )}
      </Card>

      <AttachmentPanel ownerKind="lot" ownerId={l.id} title="Lab reports and files" />

      <LotFormDialog open={editingLot} lot={l} onClose={() => setEditingLot(false)} />
      <LabResultFormDialog open={resultForm.open} result={resultForm.result} lotId={l.id} ciLimits={l.thresholds.cloggingIndex} onClose={() => setResultForm({ open: false, result: null })} />
      <Dialog
        open={deletingLot}
        onClose={() => {
          setDeletingLot(false);
          setLotRefusal(null);
        }}
        size="sm"
        title={`Delete ${l.code}?`}
        description={lotRefusal ?? `The lot and its ${l.labResultCount} lab result${l.labResultCount === 1 ? '' : 's'} are deleted. This cannot be undone.`}
        footer={
          <>
            <Button
              variant="secondary"
              onClick={() => {
                setDeletingLot(false);
                setLotRefusal(null);
              }}
            >
              Keep
            </Button>
            {lotRefusal ? (
              <ArchiveOffer
                kind="lots"
                id={l.id}
                name={l.code}
                onDone={() => {
                  setDeletingLot(false);
                  setLotRefusal(null);
                }}
              />
            ) : null}
            <Button
              variant="danger"
              className={lotRefusal ? 'hidden' : undefined}
              loading={deleteLot.isPending}
              onClick={() =>
                deleteLot.mutate(l.id, {
                  onSuccess: () => {
                    toast.success('Lot deleted', `${l.code} · ${l.name}`);
                    navigate(paths.cellar);
                  },
                  onError: (error) => {
                    if (isInRecord(error)) {
                      setLotRefusal(errorMessage(error));
                      return;
                    }
                    toast.error('Not deleted', errorMessage(error));
                    setDeletingLot(false);
                  },
                })
              }
            >
              Delete lot
            </Button>
          </>
        }
      />
      <ConfirmDialog
        open={deletingResult !== null}
        onClose={() => setDeletingResult(null)}
        title="Delete this lab result?"
        description={deletingResult ? `Sampled ${formatDateTime(deletingResult.sampledAt)}. The readiness is judged again on the latest remaining result.` : undefined}
        cancelLabel="Keep"
        confirmLabel="Delete lab result"
        pending={deleteResult.isPending}
        onConfirm={() =>
          deletingResult &&
          deleteResult.mutate(
            { lotId: l.id, id: deletingResult.id },
            {
              onSuccess: () => toast.success('Lab result deleted'),
              onError: (error) => toast.error('Not deleted', errorMessage(error)),
              onSettled: () => setDeletingResult(null),
            },
          )
        }
      />
    </div>
  );
}
