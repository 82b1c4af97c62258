import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CloseRunInput } from '@shared/schemas/runs';
import type { RunDetailDto } from '@shared/types/runs';
import { api } from '@/lib/api-client';
import { cartridgesCacheKey, runsKeys } from './keys';

export const closeRun = ({ runId, input }: { runId: string; input: CloseRunInput }) =>
  api.post<RunDetailDto>(`/runs/${encodeURIComponent(runId)}/close`, input);
export function useCloseRun() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: closeRun,
    onSuccess: (run) => {
      qc.setQueryData(runsKeys.detail(run.id), run);
      void qc.invalidateQueries({ queryKey: runsKeys.list() });
      void qc.invalidateQueries({ queryKey: runsKeys.startOptions() });
      void qc.invalidateQueries({ queryKey: cartridgesCacheKey });
    },
  });
}
