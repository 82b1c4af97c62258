import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LogCycleInput } from '@shared/schemas/care';
import type { CycleResultDto } from '@shared/types/care';
import { api } from '@/lib/api-client';
import { careKeys, cartridgesCacheKey, todayCacheKey } from './keys';

export const logCycle = ({ cartridgeId, input }: { cartridgeId: string; input: LogCycleInput }) =>
  api.post<CycleResultDto>(`/cartridges/${encodeURIComponent(cartridgeId)}/cycles`, input);

export function useLogCycle() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: logCycle,
    onSuccess: (_result, { cartridgeId }) => {
      void qc.invalidateQueries({ queryKey: careKeys.recent() });
      void qc.invalidateQueries({ queryKey: careKeys.target(cartridgeId) });
      void qc.invalidateQueries({ queryKey: cartridgesCacheKey });
      void qc.invalidateQueries({ queryKey: todayCacheKey });
    },
  });
}
