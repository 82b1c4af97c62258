export const winerySettingsKeys = {
  all: ['winery-settings'] as const,
  detail: () => [...winerySettingsKeys.all, 'detail'] as const,
};
