import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateHousingInput } from '@shared/schemas/equipment';
import type { HousingDto } from '@shared/types/equipment';
import { api } from '@/lib/api-client';
import { equipmentKeys } from './keys';

export const createHousing = (input: CreateHousingInput) => api.post<HousingDto>('/housings', input);

export function useCreateHousing() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createHousing, onSuccess: () => qc.invalidateQueries({ queryKey: equipmentKeys.housings() }) });
}
