import type { ColumnDef } from '@tanstack/react-table';
import { FileSpreadsheet, Upload } from 'lucide-react';
import { useMemo, useRef, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { IMPORT_COLUMNS, IMPORT_MAX_BYTES, IMPORT_MAX_ROWS } from '@shared/schemas/cartridges';
import type { ImportPreviewDto, ImportPreviewRowDto } from '@shared/types/cartridges';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { DataTable } from '@/components/ui/data-table';
import { FormField } from '@/components/ui/form-field';
import { Textarea } from '@/components/ui/input';
import { PageHeader } from '@/components/ui/page-header';
import { BackLink } from '@/components/records/record-page';
import { formatNumber, Quantity } from '@/components/ui/quantity';
import { ErrorState } from '@/components/ui/states';
import { StatusBadge } from '@/components/ui/status-badge';
import { useToast } from '@/components/ui/toast';
import { paths } from '@/config/paths';
import { ApiError, errorMessage } from '@/lib/api-client';
import { useCan } from '@/lib/session';
import { useImportCartridges, usePreviewImport } from '../api/import-cartridges';

const EXAMPLE = `serial,batch,type,length,received
QW-PES045-0101,B25-040,PES membrane 0.45 µm,30,2025-03-14
QW-PP5-0101,B25-041,Depth PP 5 µm,30,2025-03-14`;

const SHOWN_MAX = 500;

/** Delivery import: upload or paste the CSV, see every row checked, fix and retry, then import all rows at once. */
export function ImportPage() {
  const mayImport = useCan('cartridges:register');
  const preview = usePreviewImport();
  const importer = useImportCartridges();
  const toast = useToast();
  const navigate = useNavigate();
  const fileInput = useRef<HTMLInputElement>(null);
  const [csv, setCsv] = useState('');
  const [source, setSource] = useState<string | null>(null);
  const [result, setResult] = useState<ImportPreviewDto | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const [errorsOnly, setErrorsOnly] = useState(false);

  const check = async (text: string, from: string) => {
    setProblem(null);
    setResult(null);
    setCsv(text);
    setSource(from);
    try {
      const r = await preview.mutateAsync(text);
      setResult(r);
      setErrorsOnly(r.errorCount > 0 && r.rows.length > 50);
    } catch (e) {
      setProblem(errorMessage(e));
    }
  };

  const onFile = async (file: File | undefined) => {
    if (!file) return;
    if (file.size > IMPORT_MAX_BYTES) {
      setProblem(`${file.name} is larger than ${IMPORT_MAX_BYTES / 1024 / 1024} MB. Split the delivery into smaller files.`);
      return;
    }
    await check(await file.text(), file.name);
    if (fileInput.current) fileInput.current.value = '';
  };

  const runImport = async () => {
    setProblem(null);
    try {
      const r = await importer.mutateAsync(csv);
      toast.success(`${formatNumber(r.imported)} cartridges imported`, 'They are in stock now.');
      navigate(paths.cartridges);
    } catch (e) {
      setProblem(errorMessage(e));
      // Someone may have registered a serial in the meantime: check again to show which rows.
      if (e instanceof ApiError && e.status !== 0) void check(csv, source ?? 'the file');
    }
  };

  const columns = useMemo<ColumnDef<ImportPreviewRowDto>[]>(
    () => [
      { id: 'line', header: 'Line', meta: { numeric: true }, cell: ({ row }) => <span className="num">{row.original.line}</span> },
      {
        id: 'check',
        header: 'Check',
        cell: ({ row }) =>
          row.original.errors.length ? (
            <StatusBadge tone="stop" size="sm">
              fix
            </StatusBadge>
          ) : (
            <StatusBadge tone="ok" size="sm">
              ok
            </StatusBadge>
          ),
      },
      { id: 'serial', header: 'Serial', cell: ({ row }) => <span className="font-semibold whitespace-nowrap">{row.original.serial || '—'}</span> },
      { id: 'batch', header: 'Batch', cell: ({ row }) => <span className="whitespace-nowrap">{row.original.batch || '—'}</span> },
      { id: 'type', header: 'Type', cell: ({ row }) => <span className="whitespace-nowrap">{row.original.type || '—'}</span> },
      { id: 'length', header: 'Length', meta: { numeric: true }, cell: ({ row }) => (row.original.lengthIn ? <Quantity value={row.original.lengthIn} unit="in" /> : '—') },
      { id: 'received', header: 'Received', cell: ({ row }) => <span className="num whitespace-nowrap">{row.original.receivedAt ?? '—'}</span> },
      {
        id: 'errors',
        header: 'What to fix',
        meta: { className: 'min-w-64' },
        cell: ({ row }) =>
          row.original.errors.length ? (
            <ul className="text-sm font-semibold text-stop-700">
              {row.original.errors.map((e) => (
                <li key={e}>{e}</li>
              ))}
            </ul>
          ) : null,
      },
    ],
    [],
  );

  if (!mayImport) {
    return <ErrorState title="Importing is for owners and cellar masters" message="Your role may read the inventory but not register cartridges." />;
  }
  const rows = result ? (errorsOnly ? result.rows.filter((r) => r.errors.length) : result.rows) : [];
  const shown = rows.slice(0, SHOWN_MAX);

  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        context={
          <BackLink to={paths.cartridges} className="min-h-11">
            Cartridges
          </BackLink>
        }
        title="Import delivery"
        description={`Register a whole delivery from its CSV list. Every row is checked first; nothing is saved until all rows are right. Up to ${formatNumber(IMPORT_MAX_ROWS)} rows, ${IMPORT_MAX_BYTES / 1024 / 1024} MB.`}
      />
      <Card title="1. The delivery file" description={`Columns, with a header row: ${IMPORT_COLUMNS.join(', ')}. Type is the name in your cartridge-type catalogue; length in inches (10, 20, 30 or 40); received as YYYY-MM-DD.`}>
        <div className="flex flex-col gap-4">
          <div className="flex flex-wrap items-center gap-3">
            <input
              ref={fileInput}
              id="delivery-file"
              type="file"
              accept=".csv,text/csv,text/plain"
              className="sr-only"
              onChange={(e) => void onFile(e.target.files?.[0])}
            />
            <Button size="lg" icon={<Upload />} onClick={() => fileInput.current?.click()} loading={preview.isPending}>
              {result ? 'Upload the corrected file' : 'Choose CSV file'}
            </Button>
            <label htmlFor="delivery-file" className="sr-only">
              Delivery CSV file
            </label>
            {source ? <span className="text-sm text-ink-600">Checked: {source}</span> : null}
          </div>
          <details className="rounded border border-ink-200 px-3 py-2">
            <summary className="min-h-11 cursor-pointer content-center font-semibold text-ink-900">Or paste the rows</summary>
            <div className="mt-2 flex flex-col gap-3">
              <FormField label="CSV text" htmlFor="delivery-text" hint="Commas, semicolons or tabs between columns.">
                <Textarea id="delivery-text" rows={6} className="font-mono text-sm" placeholder={EXAMPLE} value={csv} onChange={(e) => setCsv(e.target.value)} />
              </FormField>
              <div>
                <Button variant="secondary" size="lg" onClick={() => void check(csv, 'pasted rows')} disabled={!csv.trim()} loading={preview.isPending}>
                  Check rows
                </Button>
              </div>
            </div>
          </details>
        </div>
      </Card>
      {problem ? <ErrorState title="Not imported" message={problem} /> : null}
      {result ? (
        <Card
          title="2. Check the rows"
          description={
            result.valid
              ? `All ${formatNumber(result.rows.length)} rows are ready. Nothing is saved until you import.`
              : `${formatNumber(result.errorCount)} of ${formatNumber(result.rows.length)} rows need fixing. Correct them in the file and upload it again; nothing has been saved.`
          }
          actions={
            result.valid ? (
              <Button size="lg" icon={<FileSpreadsheet />} loading={importer.isPending} onClick={() => void runImport()}>
                Import {formatNumber(result.rows.length)} cartridges
              </Button>
            ) : null
          }
          flush
        >
          {result.errorCount > 0 ? (
            <label className="flex min-h-11 items-center gap-2 border-b border-ink-200 px-4 text-sm text-ink-800">
              <input type="checkbox" className="size-5" checked={errorsOnly} onChange={(e) => setErrorsOnly(e.target.checked)} />
              Show only rows that need fixing
            </label>
          ) : null}
          {result.errorCount > 0 ? (
            // On a phone the table scrolls sideways; the rows to fix are listed here in full.
            <ul className="flex flex-col gap-2 border-b border-ink-200 px-4 py-3 sm:hidden" aria-label="Rows to fix">
              {result.rows
                .filter((r) => r.errors.length)
                .slice(0, 50)
                .map((r) => (
                  <li key={r.line} className="rounded border border-stop-200 bg-stop-50 px-3 py-2">
                    <p className="text-sm font-semibold text-ink-900">
                      Line {r.line}
                      {r.serial ? ` · ${r.serial}` : ''}
                    </p>
                    <ul className="text-sm text-stop-800">
                      {r.errors.map((e) => (
                        <li key={e}>{e}</li>
                      ))}
                    </ul>
                  </li>
                ))}
            </ul>
          ) : null}
          <DataTable className="rounded-none border-0" columns={columns} data={shown} getRowId={(r) => String(r.line)} caption="Rows of the delivery file" />
          {rows.length > SHOWN_MAX ? <p className="px-4 py-2 text-sm text-ink-600">Showing the first {SHOWN_MAX} of {formatNumber(rows.length)} rows.</p> : null}
        </Card>
      ) : null}
    </div>
  );
}
