// The signed-in person: who they are, their wineries and their role in the active one.
// Cross-cutting, so it lives in lib/ where every feature and layout may read it.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { can, type Action } from '@shared/permissions';
import type { MeDto } from '@shared/types/api';
import { paths } from '@/config/paths';
import { api, ApiError } from './api-client';
import { forgetKeptAnswers } from './offline/query-persister';
import { queryRoots } from './query-keys';

export const sessionKeys = {
  all: queryRoots.session,
  me: () => [...sessionKeys.all, 'me'] as const,
  appInfo: () => [...sessionKeys.all, 'app-info'] as const,
};

/** null when nobody is signed in. */
export async function getMe(): Promise<MeDto | null> {
  try {
    return await api.get<MeDto>('/me');
  } catch (error) {
    if (error instanceof ApiError && error.status === 401) return null;
    throw error;
  }
}

export const getMeQueryOptions = () => queryOptions({ queryKey: sessionKeys.me(), queryFn: getMe, staleTime: 60_000 });

export function useMe() {
  return useQuery(getMeQueryOptions());
}

export function activeMembership(me: MeDto | null | undefined) {
  return me?.memberships.find((m) => m.wineryId === me.activeWineryId) ?? null;
}

/** Whether the signed-in person's role in the active winery allows `action` (the server decides). */
export function useCan(action: Action): boolean {
  const { data } = useMe();
  return can(activeMembership(data)?.role, action);
}

export type AppInfo = { mailOutbox: boolean };
export const getAppInfoQueryOptions = () =>
  queryOptions({ queryKey: sessionKeys.appInfo(), queryFn: () => api.get<AppInfo>('/app-info'), staleTime: Infinity });

export function useAppInfo() {
  return useQuery(getAppInfoQueryOptions());
}

export function useSignOut() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<void>('/auth/sign-out'),
    // Nothing of the winery stays in memory or kept on the device, then a fresh load of the
    // sign-in page (plain: no "next" back to where the person was).
    onSuccess: async () => {
      qc.clear();
      qc.setQueryData(sessionKeys.me(), null);
      await forgetKeptAnswers();
      window.location.replace(paths.signIn);
    },
  });
}

/** Switching winery changes every winery-scoped answer, so all cached data is dropped. */
export function useSetActiveWinery() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (wineryId: string) => api.patch<MeDto>('/me/active-winery', { wineryId }),
    onSuccess: (me) => {
      qc.removeQueries({ predicate: (q) => q.queryKey[0] !== sessionKeys.all[0] });
      qc.setQueryData(sessionKeys.me(), me);
    },
  });
}

/** After sign-in/up/accept: forget the anonymous state and load the person afresh. */
export function useRefreshSession() {
  const qc = useQueryClient();
  return async () => {
    qc.removeQueries({ predicate: (q) => q.queryKey[0] !== sessionKeys.all[0] || q.queryKey[1] === 'me' });
    await qc.fetchQuery(getMeQueryOptions());
  };
}
