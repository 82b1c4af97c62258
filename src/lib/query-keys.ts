// The root of every query key: one per feature, plus the caches of lib/ and components/ (session,
// attachments). Each feature's `api/keys.ts` builds its factory on its root, and a mutation that
// changes another feature's data invalidates that feature's root from here — features never import
// each other, and nobody retypes another feature's key by hand. Example: runs/api/close-run.ts.

/** The first element of the query keys of each feature (TanStack Query matches keys by prefix). */
export const queryRoots = {
  alerts: ['alerts'],
  attachments: ['attachments'],
  audit: ['audit'],
  care: ['care'],
  cartridges: ['cartridges'],
  cellar: ['cellar'],
  equipment: ['equipment'],
  invitation: ['invitation'],
  outbox: ['outbox'],
  plans: ['plans'],
  records: ['records'],
  runs: ['runs'],
  session: ['session'],
  team: ['team'],
  today: ['today'],
  waiting: ['waiting'],
  winerySettings: ['winery-settings'],
} as const;

export type QueryRoot = keyof typeof queryRoots;
