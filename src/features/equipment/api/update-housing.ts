import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdateHousingInput } from '@shared/schemas/equipment';
import type { HousingDto } from '@shared/types/equipment';
import { api } from '@/lib/api-client';
import { equipmentKeys } from './keys';

export const updateHousing = ({ id, changes }: { id: string; changes: UpdateHousingInput }) =>
  api.patch<HousingDto>(`/housings/${encodeURIComponent(id)}`, changes);

export function useUpdateHousing() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: updateHousing, onSuccess: () => qc.invalidateQueries({ queryKey: equipmentKeys.housings() }) });
}
