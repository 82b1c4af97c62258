import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LotInput } from '@shared/schemas/cellar';
import type { LotDto } from '@shared/types/cellar';
import { api } from '@/lib/api-client';
import { cellarKeys, lotKeys } from './keys';

export const updateLot = ({ id, input }: { id: string; input: LotInput }) => api.patch<LotDto>(`/lots/${id}`, input);

export function useUpdateLot() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateLot,
    onSuccess: (lot) => {
      qc.setQueryData(lotKeys.detail(lot.id), lot);
      return qc.invalidateQueries({ queryKey: cellarKeys.all });
    },
  });
}
