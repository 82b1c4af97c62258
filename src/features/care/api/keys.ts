export const careKeys = {
  all: ['care'] as const,
  recent: () => [...careKeys.all, 'recent'] as const,
  targets: () => [...careKeys.all, 'target'] as const,
  target: (id: string) => [...careKeys.targets(), id] as const,
  search: (q: string) => [...careKeys.all, 'search', q] as const,
};

/** The cartridge screens' cache (their list and detail pages), refreshed after care is logged. */
export const cartridgesCacheKey = ['cartridges'] as const;
/** Today's cache: near-end-of-life cartridges and failed tests change with care. */
export const todayCacheKey = ['today'] as const;
