import { z } from 'zod';
import type { Action } from '../permissions';
import { pageFields } from './list';

/** Kinds of record the change log names. */
export const auditKinds = [
  'tank',
  'lot',
  'lab-result',
  'housing',
  'line',
  'cartridge-type',
  'cartridge',
  'care-cycle',
  'integrity-test',
  'plan',
  'run',
  'member',
  'invitation',
  'settings',
  'attachment',
] as const;
export type AuditKind = (typeof auditKinds)[number];

export const auditKindLabels: Record<AuditKind, string> = {
  tank: 'Tank',
  lot: 'Lot',
  'lab-result': 'Lab result',
  housing: 'Housing',
  line: 'Bottling line',
  'cartridge-type': 'Cartridge type',
  cartridge: 'Cartridge',
  'care-cycle': 'Care cycle',
  'integrity-test': 'Integrity test',
  plan: 'Plan',
  run: 'Run',
  member: 'Team member',
  invitation: 'Invitation',
  settings: 'Winery settings',
  attachment: 'Attachment',
};

/** What may be done to a record; state changes have their own words. */
export const auditActions = [
  'create',
  'update',
  'delete',
  'archive',
  'unarchive',
  'approve',
  'reopen',
  'done',
  'start',
  'close',
  'correct',
  'void',
  'change',
  'register',
  'import',
  'install',
  'remove',
  'retire',
  'invite',
  'revoke',
  'join',
] as const;
export type AuditAction = (typeof auditActions)[number];

export const auditActionLabels: Record<AuditAction, string> = {
  create: 'Created',
  update: 'Changed',
  delete: 'Deleted',
  archive: 'Archived',
  unarchive: 'Restored from archive',
  approve: 'Approved',
  reopen: 'Reopened',
  done: 'Marked done',
  start: 'Started',
  close: 'Closed',
  correct: 'Corrected',
  void: 'Voided',
  change: 'Cartridges changed',
  register: 'Registered',
  import: 'Imported',
  install: 'Installed',
  remove: 'Removed',
  retire: 'Retired',
  invite: 'Invited',
  revoke: 'Invitation revoked',
  join: 'Joined',
};

/**
 * The permission that lets a person read records of each kind. Owners and auditors read every
 * event; the other roles read the events of the kinds they may read.
 */
export const auditKindReadAction: Record<AuditKind, Action> = {
  tank: 'cellar:read',
  lot: 'cellar:read',
  'lab-result': 'cellar:read',
  housing: 'equipment:read',
  line: 'equipment:read',
  'cartridge-type': 'equipment:read',
  cartridge: 'cartridges:read',
  'care-cycle': 'care:read',
  'integrity-test': 'care:read',
  plan: 'plans:read',
  run: 'runs:read',
  member: 'team:read',
  invitation: 'team:invite',
  settings: 'settings:read',
  attachment: 'attachments:read',
};

export const AUDIT_PAGE_SIZE_DEFAULT = 50;
/** The CSV download holds at most this many events (the newest first); narrow the filters for older ones. */
export const AUDIT_CSV_MAX_ROWS = 50_000;

const isoDateTime = z.union([z.iso.date(), z.iso.datetime({ offset: true })], { error: 'Use a date such as 2026-03-01 (or a full ISO date-time).' });

/** Filters of the change log: `?kind=&recordId=&userId=&action=&from=&to=&page=&pageSize=`. */
export const auditFilterSchema = z
  .object({
    kind: z.enum(auditKinds, { error: `Record kind is one of: ${auditKinds.join(', ')}.` }).optional(),
    recordId: z.string().trim().min(1).max(64, { error: 'A record id is at most 64 characters.' }).optional(),
    userId: z.string().trim().min(1).max(64, { error: 'A person id is at most 64 characters.' }).optional(),
    action: z.enum(auditActions, { error: `Action is one of: ${auditActions.join(', ')}.` }).optional(),
    /** Inclusive; a bare date means from the start of that day (UTC). */
    from: isoDateTime.optional(),
    /** Inclusive; a bare date means to the end of that day (UTC). */
    to: isoDateTime.optional(),
  })
  .refine((q) => !q.from || !q.to || fromInstant(q.from) <= toInstant(q.to), { error: 'The end of the range is before its start.', path: ['to'] });
export type AuditFilter = z.infer<typeof auditFilterSchema>;

export const auditListQuerySchema = auditFilterSchema.and(
  z.object(pageFields(AUDIT_PAGE_SIZE_DEFAULT)),
);
export type AuditListQuery = z.infer<typeof auditListQuerySchema>;

/** The instant a `from` filter starts at (a bare date: 00:00 UTC). */
export function fromInstant(value: string): number {
  return value.length === 10 ? Date.parse(`${value}T00:00:00.000Z`) : Date.parse(value);
}
/** The instant a `to` filter ends at (a bare date: the end of that day, UTC). */
export function toInstant(value: string): number {
  return value.length === 10 ? Date.parse(`${value}T23:59:59.999Z`) : Date.parse(value);
}
