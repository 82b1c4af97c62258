export const loggerKeys = {
  all: ['logger-profiles'] as const,
  profiles: () => [...loggerKeys.all, 'list'] as const,
};
