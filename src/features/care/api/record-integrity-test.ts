import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RecordIntegrityInput } from '@shared/schemas/care';
import type { IntegrityResultDto } from '@shared/types/care';
import { api } from '@/lib/api-client';
import { careKeys, cartridgesCacheKey, todayCacheKey } from './keys';

export const recordIntegrityTest = ({ cartridgeId, input }: { cartridgeId: string; input: RecordIntegrityInput }) =>
  api.post<IntegrityResultDto>(`/cartridges/${encodeURIComponent(cartridgeId)}/integrity-tests`, input);

export function useRecordIntegrityTest() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: recordIntegrityTest,
    onSuccess: (_result, { cartridgeId }) => {
      void qc.invalidateQueries({ queryKey: careKeys.recent() });
      void qc.invalidateQueries({ queryKey: careKeys.target(cartridgeId) });
      void qc.invalidateQueries({ queryKey: cartridgesCacheKey });
      void qc.invalidateQueries({ queryKey: todayCacheKey });
    },
  });
}
