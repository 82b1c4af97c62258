import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListDto, OutboxMessageDto } from '@shared/types/api';
import { api } from '@/lib/api-client';
import { outboxKeys } from './keys';

/** `key`: the secret `npm start` prints beside the URL; without it only a signed-in owner may read. */
export const getOutbox = (key?: string) =>
  api.get<ListDto<OutboxMessageDto>>(key ? `/dev/outbox?key=${encodeURIComponent(key)}` : '/dev/outbox');

export const getOutboxQueryOptions = (key?: string) =>
  queryOptions({ queryKey: outboxKeys.list(key), queryFn: () => getOutbox(key), refetchInterval: 5000, retry: false });

export function useOutbox(key?: string) {
  return useQuery(getOutboxQueryOptions(key));
}
