import { FileUp, Save, Upload } from 'lucide-react';
import { useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import {
  LOGGER_FILE_MAX_BYTES,
  LOGGER_MAX_ROWS,
  loggerFlowUnits,
  loggerMappingSchema,
  loggerPressureUnits,
  loggerTempUnits,
  loggerTimeFormats,
  loggerUnitLabels,
  loggerVolumeUnits,
  type LoggerMapping,
} from '@shared/schemas/logger';
import type { LoggerPreviewDto, LoggerProfileDto } from '@shared/types/logger';
import { Button } from '@/components/ui/button';
import { CautionPanel } from '@/components/ui/caution';
import { Card } from '@/components/ui/card';
import { FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { PageHeader } from '@/components/ui/page-header';
import { BackLink } from '@/components/records/record-page';
import { formatNumber } from '@/components/ui/quantity';
import { Select } from '@/components/ui/select';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { StatusBadge } from '@/components/ui/status-badge';
import { useToast } from '@/components/ui/toast';
import { lazyChart } from '@/components/ui/lazy-chart';
import { ApiError, errorMessage } from '@/lib/api-client';
import { useCan } from '@/lib/session';
import { useUnits } from '@/lib/units';
import { useImportLoggerFile, usePreviewLoggerFile } from '../api/import-logger-file';
import { useLoggerProfiles } from '../api/get-logger-profiles';
import { useCreateLoggerProfile } from '../api/save-logger-profile';
import { decodeSample, draftFieldOf, draftToMapping, guessDraft, mappingToDraft, sampleFile, type FileSample, type MappingDraft } from './mapping-draft';

const LoggerChart = lazyChart(
  () => import('./logger-chart').then((m) => m.LoggerChart),
  () => 'h-56',
);

const LAST_PROFILE = 'porewise.logger.lastProfile';
const NEW = 'new';
const SHOWN_ROWS = 10;
const SHOWN_ERRORS = 50;

const unitOptions = (units: readonly string[]) => units.map((u) => ({ value: u, label: loggerUnitLabels[u] ?? u }));
const formatOptions = loggerTimeFormats.map((f) => ({
  value: f,
  label: f === 'auto' ? 'Find out from the file' : f === 'epoch-s' ? 'Seconds since 1970' : f === 'epoch-ms' ? 'Milliseconds since 1970' : f,
}));

function rememberProfile(id: string) {
  try {
    localStorage.setItem(LAST_PROFILE, id);
  } catch {
    /* private mode: nothing to remember */
  }
}
function lastProfile(): string | null {
  try {
    return localStorage.getItem(LAST_PROFILE);
  } catch {
    return null;
  }
}

/** One line saying how a saved profile reads a file. */
function describe(m: LoggerMapping): string {
  const u = (x: string) => loggerUnitLabels[x] ?? x;
  const litres = m.volume ? `${m.volume.kind === 'totaliser' ? 'totaliser' : 'litres'} “${m.volume.column}” (${u(m.volume.unit)})` : `flow “${m.flow!.column}” (${u(m.flow!.unit)}) added up`;
  const pressures = m.upstream && m.downstream ? `“${m.upstream.column}” / “${m.downstream.column}” (${u(m.upstream.unit)})` : `ΔP “${m.dp!.column}” (${u(m.dp!.unit)})`;
  const sep = m.delimiter === ';' ? 'semicolons' : m.delimiter === '\t' ? 'tabs' : m.delimiter === ',' ? 'commas' : 'any separator';
  return `Time “${m.time.column}”${m.timeZone ? ` in ${m.timeZone}` : ' in UTC'} · ${litres} · ${pressures} · ${sep}, decimal ${m.decimal === ',' ? 'comma' : 'point'}`;
}

export interface LoggerImportPageProps {
  runId: string;
  /** The run's name for the header (lot code and name). */
  runTitle: ReactNode;
  running: boolean;
  stages: { index: number; name: string }[];
  initialStage: number;
  /** Where "back" goes (the run page). */
  backTo: string;
  /** After a successful import: refresh the run and go back to it. */
  onImported: () => void;
}

/**
 * Import a logger's export into a run's stage: choose the file, read it with a saved logger
 * profile (or map its columns once and save them as one), see the first rows, the ΔP against
 * litres and every row that is wrong, then import all rows or none.
 */
export function LoggerImportPage({ runId, runTitle, running, stages, initialStage, backTo, onImported }: LoggerImportPageProps) {
  const mayImport = useCan('runs:log');
  const units = useUnits();
  const toast = useToast();
  const profiles = useLoggerProfiles();
  const preview = usePreviewLoggerFile();
  const importer = useImportLoggerFile();
  const createProfile = useCreateLoggerProfile();
  const fileInput = useRef<HTMLInputElement>(null);

  const [stageIndex, setStageIndex] = useState(initialStage);
  const [file, setFile] = useState<File | null>(null);
  const [sample, setSample] = useState<FileSample | null>(null);
  const [profileId, setProfileId] = useState<string | null>(null);
  const [draft, setDraft] = useState<MappingDraft | null>(null);
  const [draftErrors, setDraftErrors] = useState<Partial<Record<keyof MappingDraft, string>>>({});
  const [profileName, setProfileName] = useState('');
  const [nameError, setNameError] = useState<string | null>(null);
  const [result, setResult] = useState<LoggerPreviewDto | null>(null);
  const [problem, setProblem] = useState<string | null>(null);

  const items = useMemo(() => profiles.data?.items ?? [], [profiles.data]);
  // The profile used last (or the only one) is chosen already: next time it is file, then Import.
  useEffect(() => {
    if (profileId !== null || !profiles.data) return;
    const last = lastProfile();
    setProfileId(items.find((p) => p.id === last)?.id ?? items[0]?.id ?? NEW);
  }, [profiles.data, items, profileId]);

  const chosen: LoggerProfileDto | null = items.find((p) => p.id === profileId) ?? null;
  const mapping: LoggerMapping | null = chosen ? chosen.mapping : draft ? draftToMapping(draft) : null;

  const runPreview = async (m: { profileId?: string; mapping?: LoggerMapping }, f: File | null = file) => {
    if (!f) return;
    setProblem(null);
    setResult(null);
    try {
      setResult(await preview.mutateAsync({ runId, file: f, stageIndex, ...m }));
    } catch (e) {
      setProblem(errorMessage(e));
      if (e instanceof ApiError && draft && !chosen) setDraftErrors(fieldsToDraft(e.fields));
    }
  };

  const onFile = async (f: File | undefined) => {
    if (!f) return;
    if (fileInput.current) fileInput.current.value = '';
    setResult(null);
    setProblem(null);
    if (f.size > LOGGER_FILE_MAX_BYTES) {
      setProblem(`${f.name} is larger than ${String(LOGGER_FILE_MAX_BYTES / 1024 / 1024)} MB. Split it and import the parts one after the other.`);
      return;
    }
    const text = decodeSample(new Uint8Array(await f.slice(0, 64 * 1024).arrayBuffer()));
    const s = sampleFile(text);
    setFile(f);
    setSample(s);
    const guessed = guessDraft(s);
    setDraft((d) => d ?? guessed);
    if (chosen) await runPreview({ profileId: chosen.id }, f);
  };

  const checkDraft = (): LoggerMapping | null => {
    if (!draft) return null;
    const parsed = loggerMappingSchema.safeParse(draftToMapping(draft));
    if (parsed.success) {
      setDraftErrors({});
      return parsed.data;
    }
    const fields: Record<string, string> = {};
    for (const issue of parsed.error.issues) fields[issue.path.join('.')] ??= issue.message;
    setDraftErrors(fieldsToDraft(fields, ''));
    return null;
  };

  const previewDraft = async () => {
    const m = checkDraft();
    if (m) await runPreview({ mapping: m });
  };

  const saveProfile = async () => {
    setNameError(null);
    const m = checkDraft();
    if (!m) return;
    if (!profileName.trim()) {
      setNameError('Name the profile, e.g. the logger’s make and model.');
      return;
    }
    try {
      const saved = await createProfile.mutateAsync({ name: profileName.trim(), mapping: m });
      rememberProfile(saved.id);
      setProfileId(saved.id);
      toast.success(`Logger profile “${saved.name}” saved`, 'Next time choose the file and import.');
      if (file) await runPreview({ profileId: saved.id });
    } catch (e) {
      if (e instanceof ApiError) {
        setNameError(e.fields.name ?? null);
        setDraftErrors(fieldsToDraft(e.fields));
      }
      if (!(e instanceof ApiError && e.fields.name)) setProblem(errorMessage(e));
    }
  };

  const runImport = async () => {
    if (!file || !mapping) return;
    setProblem(null);
    try {
      const r = await importer.mutateAsync({ runId, file, stageIndex, ...(chosen ? { profileId: chosen.id } : { mapping }) });
      if (chosen) rememberProfile(chosen.id);
      toast.success(
        `${formatNumber(r.imported)} reading${r.imported === 1 ? '' : 's'} imported`,
        r.skipped > 0 ? `${formatNumber(r.skipped)} were there already. The file is kept with the run.` : 'The file is kept with the run.',
      );
      onImported();
    } catch (e) {
      setProblem(errorMessage(e));
    }
  };

  if (!mayImport) return <ErrorState title="Importing is for those who log readings" message="Your role may read runs but not add readings." />;
  if (profiles.isPending) return <LoadingState />;

  const set = <K extends keyof MappingDraft>(key: K, value: MappingDraft[K]) => {
    setDraft((d) => (d ? { ...d, [key]: value } : d));
    setDraftErrors((e) => ({ ...e, [key]: undefined }));
    setResult(null);
  };
  const headerOptions = (sample?.headers ?? []).map((h) => ({ value: h, label: h }));
  const columnSelect = (key: keyof MappingDraft, label: string, opts: { optional?: boolean; hint?: string } = {}) => (
    <FormField label={label} htmlFor={`map-${key}`} error={draftErrors[key]} hint={opts.hint}>
      <Select
        id={`map-${key}`}
        value={String(draft?.[key] ?? '')}
        onChange={(e) => set(key, e.target.value as never)}
        options={headerOptions}
        placeholder={opts.optional ? 'None' : 'Choose the column'}
      />
    </FormField>
  );
  const choiceSelect = (key: keyof MappingDraft, label: string, options: { value: string; label: string }[]) => (
    <FormField label={label} htmlFor={`map-${key}`}>
      <Select id={`map-${key}`} value={String(draft?.[key] ?? '')} onChange={(e) => set(key, e.target.value as never)} options={options} />
    </FormField>
  );
  const unitSelect = (key: keyof MappingDraft, label: string, list: readonly string[]) => choiceSelect(key, label, unitOptions(list));

  const ready = result && result.errorCount === 0 && !result.alreadyImported;
  const stageName = stages.find((s) => s.index === stageIndex)?.name ?? `Stage ${String(stageIndex + 1)}`;

  return (
    <div className="mx-auto flex w-full max-w-3xl flex-col gap-6">
      <PageHeader
        context={
          <BackLink to={backTo} className="min-h-11">
            Back to the run
          </BackLink>
        }
        title="Import logger file"
        description={
          <>
            {runTitle}. Readings from a pressure logger’s export (CSV or TSV, up to {formatNumber(LOGGER_MAX_ROWS)} rows). Every row is checked first; nothing is stored until all rows are right.
          </>
        }
      />
      {!running ? <ErrorState title="This run is closed" message="A closed run takes no more readings." /> : null}
      <Card title="1. Stage and file">
        <div className="flex flex-col gap-4">
          {stages.length > 1 ? (
            <FormField label="Stage" htmlFor="import-stage">
              <Select
                id="import-stage"
                value={String(stageIndex)}
                onChange={(e) => {
                  setStageIndex(Number(e.target.value));
                  setResult(null);
                }}
                options={stages.map((s) => ({ value: String(s.index), label: `${String(s.index + 1)}. ${s.name}` }))}
              />
            </FormField>
          ) : (
            <p className="text-base text-ink-800">Stage: {stageName}</p>
          )}
          {items.length > 0 ? (
            <FormField label="Logger profile" htmlFor="import-profile" hint={chosen ? describe(chosen.mapping) : 'Map the columns of this file below, and save them for next time.'}>
              <Select
                id="import-profile"
                value={profileId ?? NEW}
                onChange={(e) => {
                  const id = e.target.value;
                  setProfileId(id);
                  setResult(null);
                  const p = items.find((x) => x.id === id);
                  if (p) {
                    rememberProfile(p.id);
                    if (file) void runPreview({ profileId: p.id });
                  } else if (sample) {
                    // A new mapping starts from the profile that was chosen (to adjust it), else from the headers.
                    setDraft(chosen ? mappingToDraft(chosen.mapping, guessDraft(sample)) : (d) => d ?? guessDraft(sample));
                    setDraftErrors({});
                  }
                }}
                options={[...items.map((p) => ({ value: p.id, label: p.name })), { value: NEW, label: 'New mapping …' }]}
              />
            </FormField>
          ) : null}
          <div className="flex flex-wrap items-center gap-3">
            <input ref={fileInput} id="logger-file" type="file" accept=".csv,.tsv,.txt,text/csv,text/plain,text/tab-separated-values" className="sr-only" onChange={(e) => void onFile(e.target.files?.[0])} />
            <label htmlFor="logger-file" className="sr-only">
              Logger file
            </label>
            <Button size="lg" icon={<Upload />} onClick={() => fileInput.current?.click()} loading={preview.isPending} disabled={!running}>
              {file ? 'Choose another file' : 'Choose logger file'}
            </Button>
            {file ? <span className="text-sm text-ink-700 [overflow-wrap:anywhere]">{file.name}</span> : null}
          </div>
        </div>
      </Card>

      {file && sample && !chosen && draft ? (
        <Card title="2. Map the columns" description={`Columns found: ${sample.headers.join(', ') || 'none'}. Choose what each one is and its unit; save it as a profile so the next file from this logger needs no mapping.`}>
          <div className="flex flex-col gap-4">
            <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
              {choiceSelect('delimiter', 'Columns separated by', [
                { value: ';', label: 'Semicolon ( ; )' },
                { value: ',', label: 'Comma ( , )' },
                { value: '\t', label: 'Tab' },
              ])}
              {choiceSelect('decimal', 'Decimal mark', [
                { value: '.', label: 'Point (1234.5)' },
                { value: ',', label: 'Comma (1234,5)' },
              ])}
              {columnSelect('timeColumn', 'Date and time')}
              <FormField label="Date-time format" htmlFor="map-timeFormat" error={draftErrors.timeFormat}>
                <Select id="map-timeFormat" value={draft.timeFormat} onChange={(e) => set('timeFormat', e.target.value)} options={formatOptions} />
              </FormField>
              <FormField label="Logger clock’s time zone" htmlFor="map-timeZone" error={draftErrors.timeZone} hint="As IANA names it, e.g. Europe/Vienna; a time written with its offset keeps it.">
                <Input id="map-timeZone" value={draft.timeZone} onChange={(e) => set('timeZone', e.target.value)} list="time-zones" autoComplete="off" />
              </FormField>
              <datalist id="time-zones">
                {Intl.supportedValuesOf('timeZone').map((z) => (
                  <option key={z} value={z} />
                ))}
              </datalist>
            </div>
            <fieldset className="flex flex-col gap-4 border-t border-ink-200 pt-4">
              <legend className="text-base font-semibold text-ink-900">Litres through the train</legend>
              <div className="grid grid-cols-1 gap-4 sm:grid-cols-3">
                <FormField label="Litres come from" htmlFor="map-litresFrom">
                  <Select
                    id="map-litresFrom"
                    value={draft.litresFrom}
                    onChange={(e) => {
                      const v = e.target.value as MappingDraft['litresFrom'];
                      set('litresFrom', v);
                      set('litresUnit', v === 'flow' ? 'L/h' : 'L');
                    }}
                    options={[
                      { value: 'volume', label: 'Litres so far' },
                      { value: 'totaliser', label: 'A totaliser (meter reading)' },
                      { value: 'flow', label: 'A flow, added up over time' },
                    ]}
                  />
                </FormField>
                {columnSelect('litresColumn', draft.litresFrom === 'flow' ? 'Flow column' : 'Litres column')}
                {unitSelect('litresUnit', 'Unit', draft.litresFrom === 'flow' ? loggerFlowUnits : loggerVolumeUnits)}
                {draft.litresFrom !== 'flow' ? (
                  <>
                    {columnSelect('flowColumn', 'Flow column', { optional: true, hint: 'Optional: the flow at each reading.' })}
                    {draft.flowColumn ? unitSelect('flowUnit', 'Flow unit', loggerFlowUnits) : null}
                  </>
                ) : null}
              </div>
            </fieldset>
            <fieldset className="flex flex-col gap-4 border-t border-ink-200 pt-4">
              <legend className="text-base font-semibold text-ink-900">Pressures</legend>
              {choiceSelect('pressures', 'The logger records', [
                { value: 'pair', label: 'Upstream and downstream pressure' },
                { value: 'dp', label: 'ΔP (differential pressure)' },
              ])}
              <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
                {draft.pressures === 'pair' ? (
                  <>
                    {columnSelect('upstreamColumn', 'Upstream column')}
                    {unitSelect('upstreamUnit', 'Upstream unit', loggerPressureUnits)}
                    {columnSelect('downstreamColumn', 'Downstream column')}
                    {unitSelect('downstreamUnit', 'Downstream unit', loggerPressureUnits)}
                  </>
                ) : (
                  <>
                    {columnSelect('dpColumn', 'ΔP column')}
                    {unitSelect('dpUnit', 'ΔP unit', loggerPressureUnits)}
                  </>
                )}
                {columnSelect('tempColumn', 'Temperature column', { optional: true })}
                {draft.tempColumn ? unitSelect('tempUnit', 'Temperature unit', loggerTempUnits) : null}
              </div>
            </fieldset>
            <div className="flex flex-col gap-3 border-t border-ink-200 pt-4 sm:flex-row sm:items-end">
              <FormField label="Save as logger profile" htmlFor="profile-name" error={nameError} className="sm:flex-1">
                <Input id="profile-name" value={profileName} onChange={(e) => setProfileName(e.target.value)} placeholder="e.g. Cellar logger DL-7" maxLength={80} />
              </FormField>
              <Button variant="secondary" size="lg" icon={<Save />} onClick={() => void saveProfile()} loading={createProfile.isPending}>
                Save profile
              </Button>
              <Button size="lg" onClick={() => void previewDraft()} loading={preview.isPending}>
                Preview
              </Button>
            </div>
          </div>
        </Card>
      ) : null}

      {problem ? <ErrorState title="Not imported" message={problem} /> : null}

      {result ? (
        <Card
          title={`${chosen || !draft ? '2' : '3'}. Check and import`}
          description={
            result.alreadyImported
              ? `This file is already imported into ${stageName}: importing it again adds nothing.`
              : result.errorCount === 0
                ? `All ${formatNumber(result.rowCount)} rows are right. Nothing is stored until you import.`
                : `${formatNumber(result.errorCount)} of ${formatNumber(result.rowCount)} rows need fixing. Correct them in the file (or the mapping) and choose it again; nothing has been stored.`
          }
        >
          <div className="flex flex-col gap-4">
            {result.errors.length > 0 ? (
              <section aria-label="Rows to fix" className="rounded border border-stop-200 bg-stop-50 px-3 py-2">
                <h3 className="text-base font-semibold text-stop-800">Rows to fix</h3>
                <ul className="mt-1 flex flex-col gap-1 text-sm text-ink-900" data-testid="logger-errors">
                  {result.errors.slice(0, SHOWN_ERRORS).map((e) => (
                    <li key={`${String(e.row)}-${e.column ?? ''}-${e.message}`}>{e.message}</li>
                  ))}
                </ul>
                {result.errorCount > SHOWN_ERRORS ? <p className="mt-1 text-sm text-ink-700">… and {formatNumber(result.errorCount - SHOWN_ERRORS)} more.</p> : null}
              </section>
            ) : null}
            {result.chart.length > 0 ? (
              <LoggerChart points={result.chart} />
            ) : null}
            {result.rows.length > 0 ? (
              <div className="flex flex-col gap-2">
                <h3 className="text-base font-semibold text-ink-900">First rows as read</h3>
                <ul className="flex flex-col gap-2 sm:hidden" aria-label="First rows as read">
                  {result.rows.slice(0, SHOWN_ROWS).map((r) => (
                    <li key={r.row} className="rounded border border-ink-200 px-3 py-2 text-sm">
                      <p className="num font-semibold text-ink-900">
                        Row {r.row} · {new Date(r.at).toLocaleString()}
                      </p>
                      <p className="num text-ink-800">
                        {units.format('volume', r.volumeL)} · ΔP {units.format('dp', r.dpBar)}
                        {r.flowLh !== null ? <> · {units.format('flow', r.flowLh)}</> : null}
                        {r.tempC !== null ? <> · {units.format('temperature', r.tempC)}</> : null}
                      </p>
                    </li>
                  ))}
                </ul>
                <div className="hidden overflow-x-auto sm:block">
                  <table className="w-full text-sm">
                    <caption className="sr-only">First rows as read</caption>
                    <thead>
                      <tr className="border-b border-ink-200 text-left text-ink-700">
                        <th className="py-1 pr-3 font-semibold">Row</th>
                        <th className="py-1 pr-3 font-semibold">Time</th>
                        <th className="py-1 pr-3 text-right font-semibold">Litres</th>
                        <th className="py-1 pr-3 text-right font-semibold">Upstream</th>
                        <th className="py-1 pr-3 text-right font-semibold">Downstream</th>
                        <th className="py-1 pr-3 text-right font-semibold">ΔP</th>
                        <th className="py-1 pr-3 text-right font-semibold">Flow</th>
                        <th className="py-1 text-right font-semibold">Temp.</th>
                      </tr>
                    </thead>
                    <tbody>
                      {result.rows.slice(0, SHOWN_ROWS).map((r) => (
                        <tr key={r.row} className="num border-b border-ink-100">
                          <td className="py-1 pr-3">{r.row}</td>
                          <td className="py-1 pr-3 whitespace-nowrap">{new Date(r.at).toLocaleString()}</td>
                          <td className="py-1 pr-3 text-right whitespace-nowrap">{units.format('volume', r.volumeL)}</td>
                          <td className="py-1 pr-3 text-right whitespace-nowrap">{units.format('pressure', r.upstreamBar)}</td>
                          <td className="py-1 pr-3 text-right whitespace-nowrap">{units.format('pressure', r.downstreamBar)}</td>
                          <td className="py-1 pr-3 text-right whitespace-nowrap">{units.format('dp', r.dpBar)}</td>
                          <td className="py-1 pr-3 text-right whitespace-nowrap">{units.format('flow', r.flowLh)}</td>
                          <td className="py-1 text-right whitespace-nowrap">{units.format('temperature', r.tempC)}</td>
                        </tr>
                      ))}
                    </tbody>
                  </table>
                </div>
              </div>
            ) : null}
            <div className="flex flex-wrap items-center gap-3">
              <Button size="lg" icon={<FileUp />} disabled={!ready || !running} loading={importer.isPending} onClick={() => void runImport()}>
                Import {formatNumber(result.rowCount)} row{result.rowCount === 1 ? '' : 's'} into {stageName}
              </Button>
              {result.alreadyImported ? <StatusBadge tone="neutral">Already imported</StatusBadge> : null}
            </div>
          </div>
        </Card>
      ) : null}
      <CautionPanel title="Check the gauges">
        A logger reads what its sensors see: check them against the housing’s gauges now and then, and never open a housing under pressure.
      </CautionPanel>
    </div>
  );
}

/** Server or schema field names (`mapping.upstream.column`, `upstream`) → the form's fields. */
function fieldsToDraft(fields: Record<string, string>, prefix = 'mapping.'): Partial<Record<keyof MappingDraft, string>> {
  const out: Partial<Record<keyof MappingDraft, string>> = {};
  for (const [path, message] of Object.entries(fields)) {
    const key = path.startsWith(prefix) ? path.slice(prefix.length) : path;
    const field = draftFieldOf[key];
    if (field) out[field] ??= message;
  }
  return out;
}
