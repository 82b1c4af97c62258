/**
 * The one permission matrix: which role may perform which action. The server's authorize
 * middleware enforces it; the client uses the same table to hide what a role may not do.
 */
export const roles = ['owner', 'cellar-master', 'winemaker', 'technician', 'auditor'] as const;
export type Role = (typeof roles)[number];

export const roleLabels: Record<Role, string> = {
  owner: 'Owner',
  'cellar-master': 'Cellar master',
  winemaker: 'Winemaker',
  technician: 'Technician',
  auditor: 'Auditor',
};

export const roleDescriptions: Record<Role, string> = {
  owner: 'Everything, including the team, roles, settings and deleting records.',
  'cellar-master': 'Plans bottling days, owns equipment and cartridges, approves plans, logs runs.',
  winemaker: 'Judges readiness, edits lots and lab results, drafts and compares plans, logs runs.',
  technician: 'Views plans; logs runs, readings, cycles and integrity tests; attaches files.',
  auditor: 'Reads everything and exports records; changes nothing.',
};

const all = roles;
const editors = ['owner', 'cellar-master', 'winemaker'] as const;
const loggers = ['owner', 'cellar-master', 'winemaker', 'technician'] as const;
const equipmentOwners = ['owner', 'cellar-master'] as const;

export const permissions = {
  'team:read': all,
  'team:invite': ['owner'],
  'team:change-role': ['owner'],
  'team:remove': ['owner'],
  'settings:read': all,
  'settings:edit': ['owner'],
  'mail-outbox:read': ['owner'],
  'cellar:read': all,
  'cellar:edit': editors,
  'lab-results:edit': editors,
  'equipment:read': all,
  'equipment:edit': equipmentOwners,
  'cartridges:read': all,
  'cartridges:register': equipmentOwners,
  'cartridges:move': ['owner', 'cellar-master', 'technician'],
  'plans:read': all,
  'plans:draft': editors,
  'plans:approve': equipmentOwners,
  'runs:read': all,
  'runs:log': loggers,
  'care:read': all,
  'care:log': loggers,
  'attachments:read': all,
  'attachments:upload': loggers,
  'records:read': all,
  'records:export': all,
  'records:delete': ['owner'],
  'calc:use': all,
  'notifications:read': all,
  'mail-failures:manage': ['owner'],
  // The change log: everyone reads it (owners and auditors every event, the others the kinds of record they may read).
  'audit:read': all,
  'winery:export': ['owner'],
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof permissions;
export const actions = Object.keys(permissions) as Action[];

/** True when `role` may perform `action`. */
export function can(role: Role | null | undefined, action: Action): boolean {
  if (!role) return false;
  return (permissions[action] as readonly Role[]).includes(role);
}
