import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { StartRunInput } from '@shared/schemas/runs';
import type { RunDetailDto } from '@shared/types/runs';
import { api } from '@/lib/api-client';
import { runKeys } from './keys';

export const startRun = (input: StartRunInput) => api.post<RunDetailDto>('/runs', input);
export function useStartRun() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: startRun,
    onSuccess: (run) => {
      qc.setQueryData(runKeys.detail(run.id), run);
      void qc.invalidateQueries({ queryKey: runKeys.list() });
      void qc.invalidateQueries({ queryKey: runKeys.startOptions() });
    },
  });
}
