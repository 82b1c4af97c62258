import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LogReadingInput } from '@shared/schemas/runs';
import type { RunReadingDto } from '@shared/types/runs';
import { api } from '@/lib/api-client';
import { runsKeys } from './keys';

/** The reading carries its own clientKey, so a resend (after a lost answer) is stored once. */
export const logReading = ({ runId, input }: { runId: string; input: LogReadingInput }) =>
  api.post<RunReadingDto>(`/runs/${encodeURIComponent(runId)}/readings`, input);
export function useLogReading() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: logReading,
    onSuccess: (_r, { runId }) => {
      void qc.invalidateQueries({ queryKey: runsKeys.detail(runId) });
      void qc.invalidateQueries({ queryKey: runsKeys.list() });
    },
  });
}
