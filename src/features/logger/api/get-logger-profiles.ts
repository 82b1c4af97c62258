import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LoggerProfileDto } from '@shared/types/logger';
import { api } from '@/lib/api-client';
import { loggerKeys } from './keys';

export const getLoggerProfiles = () => api.get<{ items: LoggerProfileDto[] }>('/logger-profiles');
export const getLoggerProfilesQueryOptions = () => queryOptions({ queryKey: loggerKeys.profiles(), queryFn: getLoggerProfiles });
export function useLoggerProfiles() {
  return useQuery(getLoggerProfilesQueryOptions());
}
