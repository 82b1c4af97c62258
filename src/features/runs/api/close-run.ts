import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CloseRunInput } from '@shared/schemas/runs';
import type { RunDetailDto } from '@shared/types/runs';
import { api } from '@/lib/api-client';
import { queryRoots } from '@/lib/query-keys';
import { runKeys } from './keys';

export const closeRun = ({ runId, input }: { runId: string; input: CloseRunInput }) =>
  api.post<RunDetailDto>(`/runs/${encodeURIComponent(runId)}/close`, input);
export function useCloseRun() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: closeRun,
    onSuccess: (run) => {
      qc.setQueryData(runKeys.detail(run.id), run);
      void qc.invalidateQueries({ queryKey: runKeys.list() });
      void qc.invalidateQueries({ queryKey: runKeys.startOptions() });
      void qc.invalidateQueries({ queryKey: queryRoots.cartridges });
    },
  });
}
