import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TeamDto } from '@shared/types/api';
import { api } from '@/lib/api-client';
import { teamKeys } from './keys';

export const getTeam = () => api.get<TeamDto>('/team');

export const getTeamQueryOptions = () => queryOptions({ queryKey: teamKeys.detail(), queryFn: getTeam });

export function useTeam() {
  return useQuery(getTeamQueryOptions());
}
