import type { ColumnDef } from '@tanstack/react-table';
import { Paperclip } from 'lucide-react';
import { useMemo, useState } from 'react';
import type { LabResultDto } from '@shared/types/cellar';
import { AttachmentPanel } from '@/components/attachments/attachment-panel';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { DataTable } from '@/components/ui/data-table';
import { Quantity } from '@/components/ui/quantity';
import { StatusBadge, type StatusTone } from '@/components/ui/status-badge';
import { FixedQuantity, MetricQuantity } from './metric-quantity';
import { formatDate, formatDateTime } from '@/lib/dates';

// The badge says what the lot's readiness says: the verdict against the winery's limits (engine).
const verdictTone: Record<'ready' | 'borderline' | 'not-ready', StatusTone> = { ready: 'ok', borderline: 'watch', 'not-ready': 'stop' };

function DiscCell({ disc }: { disc: LabResultDto['disc'] }) {
  if (!disc) return <span className="text-ink-500">—</span>;
  if (!disc.computable) {
    return (
      <span className="block max-w-64 text-sm whitespace-normal text-watch-800">
        <span className="font-semibold">Not computable:</span> {disc.reason}
      </span>
    );
  }
  return (
    <span className="flex flex-col items-end">
      <MetricQuantity kind="loading" value={disc.vmaxLPerM2} />
      <span className="text-xs text-ink-600">
        J₀ <MetricQuantity kind="flux" value={disc.j0LPerM2H} />
      </span>
    </span>
  );
}

/** The lot's lab results, newest first, with the computed clogging index and Vmax. */
export function LabResultsTable({
  results,
  mayEdit,
  mayDelete,
  onEdit,
  onDelete,
}: {
  results: LabResultDto[];
  mayEdit: boolean;
  mayDelete: boolean;
  onEdit: (r: LabResultDto) => void;
  onDelete: (r: LabResultDto) => void;
}) {
  const [filesFor, setFilesFor] = useState<LabResultDto | null>(null);
  const columns = useMemo<ColumnDef<LabResultDto>[]>(
    () => [
      { header: 'Sampled', accessorKey: 'sampledAt', cell: ({ row }) => <span className="num whitespace-nowrap">{formatDateTime(row.original.sampledAt)}</span> },
      { header: 'Turbidity', accessorKey: 'turbidityNtu', meta: { numeric: true }, cell: ({ row }) => <FixedQuantity value={row.original.turbidityNtu} unit="NTU" digits={1} /> },
      {
        header: 'T200 / T400',
        id: 'times',
        meta: { numeric: true },
        cell: ({ row }) =>
          row.original.t200s === null ? <span className="text-ink-500">—</span> : <Quantity value={`${row.original.t200s} / ${row.original.t400s}`} unit="s" />,
      },
      {
        header: 'Clogging index',
        accessorKey: 'cloggingIndex',
        meta: { numeric: true },
        cell: ({ row }) =>
          row.original.cloggingIndex === null ? (
            <span className="text-ink-500">—</span>
          ) : (
            <span className="inline-flex items-center gap-2">
              <Quantity value={row.original.cloggingIndex} unit="s" digits={0} />
              {row.original.cloggingIndexBand ? (
                <span title={row.original.cloggingIndexBand.reason}>
                  <StatusBadge size="sm" tone={verdictTone[row.original.cloggingIndexBand.verdict]}>
                    {row.original.cloggingIndexBand.short}
                  </StatusBadge>
                </span>
              ) : null}
            </span>
          ),
      },
      { header: 'Vmax', id: 'vmax', meta: { numeric: true }, cell: ({ row }) => <DiscCell disc={row.original.disc} /> },
      { header: 'Free SO₂', accessorKey: 'freeSo2MgL', meta: { numeric: true }, cell: ({ row }) => <FixedQuantity value={row.original.freeSo2MgL} unit="mg/L" digits={0} /> },
      { header: 'Notes', accessorKey: 'notes', meta: { className: 'min-w-40 text-ink-700' } },
      {
        id: 'files',
        header: () => <span className="sr-only">Files</span>,
        cell: ({ row }) => (
          <Button
            variant="ghost"
            size="sm"
            aria-label={`Files of the sample of ${formatDate(row.original.sampledAt)}`}
            icon={<Paperclip aria-hidden="true" className="size-4" />}
            onClick={() => setFilesFor(row.original)}
          >
            Files
          </Button>
        ),
      },
      ...(mayEdit
        ? [
            {
              id: 'actions',
              header: () => <span className="sr-only">Actions</span>,
              cell: ({ row }: { row: { original: LabResultDto } }) => (
                <div className="flex justify-end gap-1">
                  <Button variant="ghost" size="sm" onClick={() => onEdit(row.original)}>
                    Edit
                  </Button>
                  {mayDelete ? (
                    <Button variant="ghost" size="sm" onClick={() => onDelete(row.original)}>
                      Delete
                    </Button>
                  ) : null}
                </div>
              ),
            } satisfies ColumnDef<LabResultDto>,
          ]
        : []),
    ],
    [mayEdit, mayDelete, onEdit, onDelete],
  );
  return (
    <>
      <DataTable caption="Lab results, newest first" columns={columns} data={results} getRowId={(r) => r.id} empty="No lab results yet." />
      <Dialog
        open={filesFor !== null}
        onClose={() => setFilesFor(null)}
        title={filesFor ? `Lab report of ${formatDate(filesFor.sampledAt)}` : 'Lab report'}
        description="The laboratory's report and any other files for this sample."
        size="lg"
      >
        {filesFor ? <AttachmentPanel ownerKind="lab-result" ownerId={filesFor.id} title="Files of this sample" /> : null}
      </Dialog>
    </>
  );
}
