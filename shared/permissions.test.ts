import { describe, expect, it } from 'vitest';
import { actions, can, permissions, roles, type Action, type Role } from './permissions';

// Expected rights per role, written out from the product's role table (not derived from the matrix).
const expected: Record<Role, Action[]> = {
  owner: actions,
  'cellar-master': actions.filter(
    (a) => !['team:invite', 'team:change-role', 'team:remove', 'settings:edit', 'mail-outbox:read', 'mail-failures:manage', 'records:delete', 'winery:export'].includes(a),
  ),
  winemaker: actions.filter(
    (a) =>
      a.endsWith(':read') && a !== 'mail-outbox:read' ||
      ['cellar:edit', 'lab-results:edit', 'plans:draft', 'runs:log', 'care:log', 'attachments:upload', 'records:export', 'calc:use'].includes(a),
  ),
  technician: actions.filter(
    (a) =>
      a.endsWith(':read') && a !== 'mail-outbox:read' ||
      ['cartridges:move', 'runs:log', 'care:log', 'attachments:upload', 'records:export', 'calc:use'].includes(a),
  ),
  auditor: actions.filter((a) => (a.endsWith(':read') && a !== 'mail-outbox:read') || a === 'records:export' || a === 'calc:use'),
};

describe('permission matrix', () => {
  it.each(roles.flatMap((role) => actions.map((action) => [role, action] as const)))('%s → %s', (role, action) => {
    expect(can(role, action)).toBe(expected[role].includes(action));
  });

  it('the auditor changes nothing', () => {
    const writes = actions.filter((a) => !a.endsWith(':read') && a !== 'records:export' && a !== 'calc:use');
    expect(writes.some((a) => can('auditor', a))).toBe(false);
  });

  it('every action names at least one role and only known roles', () => {
    for (const allowed of Object.values(permissions)) {
      expect(allowed.length).toBeGreaterThan(0);
      for (const r of allowed) expect(roles).toContain(r);
    }
  });

  it('no role means no right', () => {
    expect(can(null, 'team:read')).toBe(false);
  });
});
