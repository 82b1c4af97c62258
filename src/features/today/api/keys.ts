export const todayKeys = {
  all: ['today'] as const,
  detail: () => [...todayKeys.all, 'detail'] as const,
};
