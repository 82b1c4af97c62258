import { queryOptions, useQuery } from '@tanstack/react-query';
import type { WinerySettingsDto } from '@shared/types/api';
import { api } from '@/lib/api-client';
import { winerySettingsKeys } from './keys';

export const getWinerySettings = () => api.get<WinerySettingsDto>('/settings/winery');

export const getWinerySettingsQueryOptions = () => queryOptions({ queryKey: winerySettingsKeys.detail(), queryFn: getWinerySettings });

export function useWinerySettings() {
  return useQuery(getWinerySettingsQueryOptions());
}
