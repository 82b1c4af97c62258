import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { RunStartCheckDto } from '@shared/types/runs';
import { api } from '@/lib/api-client';
import { queryRoots } from '@/lib/query-keys';
import { runKeys } from './keys';

export const getRunStartCheck = (planLotId: string) => api.get<RunStartCheckDto>(`/runs/start-check?planLotId=${encodeURIComponent(planLotId)}`);
export const runStartCheckQueryOptions = (planLotId: string) =>
  queryOptions({ queryKey: runKeys.startCheck(planLotId), queryFn: () => getRunStartCheck(planLotId) });
export function useRunStartCheck(planLotId: string, enabled = true) {
  return useQuery({ ...runStartCheckQueryOptions(planLotId), enabled });
}

/** "Plan with what is installed": the stage's planned type becomes the one in its housing. */
export const planWithInstalled = (input: { planLotId: string; stageIndex: number }) => api.post<RunStartCheckDto>('/runs/plan-with-installed', input);
export function usePlanWithInstalled() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: planWithInstalled,
    onSuccess: (check) => {
      qc.setQueryData(runStartCheckQueryOptions(check.planLotId).queryKey, check);
      void qc.invalidateQueries({ queryKey: runKeys.startOptions() });
      void qc.invalidateQueries({ queryKey: queryRoots.plans });
    },
  });
}
