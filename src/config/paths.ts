/** Typed route paths: the one place the client's URLs are spelled. */
export const paths = {
  signIn: '/sign-in',
  signUp: '/sign-up',
  confirmSignUp: '/confirm-sign-up',
  forgotPassword: '/forgot-password',
  resetPassword: '/reset-password',
  invitation: '/invitation',
  home: '/',
  today: '/today',
  cellar: '/cellar',
  lot: (id: string) => `/cellar/lots/${id}`,
  equipment: '/equipment',
  cartridges: '/cartridges',
  cartridge: (id: string) => `/cartridges/${id}`,
  cartridgeImport: '/cartridges/import',
  plans: '/plans',
  plan: (id: string) => `/plans/${id}`,
  runs: '/runs',
  run: (id: string) => `/runs/${id}`,
  /** Import a logger file into a run's stage. */
  runImport: (id: string, stageIndex?: number) => `/runs/${id}/import${stageIndex === undefined ? '' : `?stage=${String(stageIndex)}`}`,
  care: '/care',
  records: '/records',
  record: (lotId: string) => `/records/lots/${lotId}`,
  team: '/team',
  settings: '/settings',
  notifications: '/notifications',
  outbox: '/outbox',
  recordsChanges: '/records/changes',
  /** Entries kept on this device that wait to be sent or were refused. */
  waiting: '/waiting',
} as const;

export function withNext(path: string, next: string | null | undefined) {
  return next ? `${path}?next=${encodeURIComponent(next)}` : path;
}

/** Only same-app paths may be used as a post-sign-in destination. */
export function safeNext(next: string | null | undefined, fallback: string = paths.home) {
  return next && next.startsWith('/') && !next.startsWith('//') ? next : fallback;
}
