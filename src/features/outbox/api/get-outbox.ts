import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListDto, OutboxMessageDto } from '@shared/types/api';
import { api } from '@/lib/api-client';

export const outboxKeys = { all: ['outbox'] as const, list: () => [...outboxKeys.all, 'list'] as const };

export const getOutbox = () => api.get<ListDto<OutboxMessageDto>>('/dev/outbox');

export const getOutboxQueryOptions = () => queryOptions({ queryKey: outboxKeys.list(), queryFn: getOutbox, refetchInterval: 5000 });

export function useOutbox() {
  return useQuery(getOutboxQueryOptions());
}
