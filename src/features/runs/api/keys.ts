export const runsKeys = {
  all: ['runs'] as const,
  list: () => [...runsKeys.all, 'list'] as const,
  startOptions: () => [...runsKeys.all, 'start-options'] as const,
  detail: (id: string) => [...runsKeys.all, 'detail', id] as const,
};

/** The cartridge screens' cache: closing a run adds litres to installed cartridges. */
export const cartridgesCacheKey = ['cartridges'] as const;
