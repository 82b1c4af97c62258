import type { QueryClient } from '@tanstack/react-query';
import type { LogReadingInput } from '@shared/schemas/runs';
import type { LoggedReadingDto, RunDetailDto } from '@shared/types/runs';
import { api } from '@/lib/api-client';
import { onEntryStored, submit, type Outcome } from '@/lib/offline/outbox-runtime';
import { runKeys } from './keys';

/** The reading carries its own clientKey, so a resend (after a lost answer) is stored once. */
export const logReading = ({ runId, input }: { runId: string; input: LogReadingInput }) =>
  api.post<LoggedReadingDto>(`/runs/${encodeURIComponent(runId)}/readings?with=stage`, input);

/** Puts the server's answer for one reading into the cached run: its stage and the run's totals. */
export function applyLoggedReading(qc: QueryClient, runId: string, answer: LoggedReadingDto) {
  const { stage, run } = answer;
  // The readings tables page from the server: they load the new reading afresh.
  void qc.invalidateQueries({ queryKey: runKeys.readings(runId) });
  if (!stage || !run) {
    void qc.invalidateQueries({ queryKey: runKeys.detail(runId) });
    return;
  }
  qc.setQueryData<RunDetailDto>(runKeys.detail(runId), (old) =>
    old ? { ...old, ...run, stages: old.stages.map((s) => (s.index === stage.index ? stage : s)) } : old,
  );
}

// Readings sent later from the outbox (one alone answers with its stage; a batch answers counts).
onEntryStored('reading', (entry, answer, qc) => {
  if (!entry.runId) return;
  const a = answer as Partial<LoggedReadingDto> | null;
  if (a && 'stage' in a && a.stage) applyLoggedReading(qc, entry.runId, a as LoggedReadingDto);
  else {
    void qc.invalidateQueries({ queryKey: runKeys.detail(entry.runId) });
    void qc.invalidateQueries({ queryKey: runKeys.readings(entry.runId) });
  }
});

/**
 * Keeps the reading on the device and sends it (after anything waiting before it). Stored: the
 * cached run is updated from the answer, not reloaded. No connection: it waits in the outbox.
 */
export function keepAndSendReading(run: Pick<RunDetailDto, 'id' | 'lotCode'>, input: LogReadingInput, label: string): Promise<Outcome> {
  return submit({
    kind: 'reading',
    id: input.clientKey,
    runId: run.id,
    path: `/runs/${encodeURIComponent(run.id)}/readings`,
    body: input,
    label: `Reading · ${run.lotCode} · ${label}`,
    invalidate: [[...runKeys.list()]],
  });
}
