import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CorrectReadingInput, RunChangeInput, VoidReadingInput } from '@shared/schemas/runs';
import type { RunDetailDto } from '@shared/types/runs';
import { api } from '@/lib/api-client';
import { queryRoots } from '@/lib/query-keys';
import { runKeys } from './keys';

export const changeRunCartridges = ({ runId, input }: { runId: string; input: RunChangeInput }) =>
  api.post<RunDetailDto>(`/runs/${encodeURIComponent(runId)}/changes`, input);
export function useChangeRunCartridges() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: changeRunCartridges,
    onSuccess: (run) => {
      qc.setQueryData(runKeys.detail(run.id), run);
      void qc.invalidateQueries({ queryKey: queryRoots.cartridges });
    },
  });
}

export const correctReading = ({ runId, readingId, input }: { runId: string; readingId: string; input: CorrectReadingInput }) =>
  api.post<RunDetailDto>(`/runs/${encodeURIComponent(runId)}/readings/${encodeURIComponent(readingId)}/correct`, input);
export const voidReading = ({ runId, readingId, input }: { runId: string; readingId: string; input: VoidReadingInput }) =>
  api.post<RunDetailDto>(`/runs/${encodeURIComponent(runId)}/readings/${encodeURIComponent(readingId)}/void`, input);
export function useCorrectReading() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: correctReading,
    onSuccess: (run) => {
      qc.setQueryData(runKeys.detail(run.id), run);
      void qc.invalidateQueries({ queryKey: runKeys.readings(run.id) });
    },
  });
}
export function useVoidReading() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: voidReading,
    onSuccess: (run) => {
      qc.setQueryData(runKeys.detail(run.id), run);
      void qc.invalidateQueries({ queryKey: runKeys.readings(run.id) });
    },
  });
}
