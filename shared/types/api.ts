import type { Role } from '../permissions';
import type { UnitSystem } from '../schemas/common';

/**
 * Every error answer: `{ error: { code, message, fields? } }`, with more members for some codes:
 * `reasons` on 409 run_blocked, `record` and `canArchive` on 409 in_record.
 */
export type ApiErrorBody = {
  error: {
    code: string;
    message: string;
    fields?: Record<string, string>;
    reasons?: { stageIndex: number; code: string; message: string }[];
    record?: { kind: string; id: string; label: string };
    canArchive?: boolean;
  };
};

export type UserDto = { id: string; name: string; email: string; units: UnitSystem };
export type MembershipDto = { wineryId: string; wineryName: string; role: Role };
export type MeDto = { user: UserDto; memberships: MembershipDto[]; activeWineryId: string | null };

export type MemberDto = { userId: string; name: string; email: string; role: Role; joinedAt: string };
export type InvitationDto = {
  id: string;
  email: string;
  role: Role;
  invitedBy: string | null;
  expiresAt: string;
  createdAt: string;
};
export type TeamDto = { members: MemberDto[]; invitations: InvitationDto[] };

export type InvitationPreviewDto = {
  wineryName: string;
  role: Role;
  email: string;
  accountExists: boolean;
  expiresAt: string;
};

export type OutboxMessageDto = {
  id: string;
  to: string[];
  subject: string;
  text: string;
  receivedAt: string;
};

export type ListDto<T> = { items: T[]; total: number };

export type WinerySettingsDto = {
  wineryId: string;
  name: string;
  /** The thresholds in use (the winery's own, or the defaults). */
  readinessThresholds: import('../engine').ReadinessThresholds;
  /** True when the winery uses the defaults. */
  readinessThresholdsAreDefault: boolean;
  defaultReadinessThresholds: import('../engine').ReadinessThresholds;
  /** IANA time zone of the winery: the digest goes at 07:00 there, calendars use it. */
  timeZone: string;
  /** Days an order of cartridges takes to arrive (the stock alert's lead time). */
  orderLeadTimeDays: number;
  /** The smallest ΔP step the winery's gauges show, bar (runs count fouling only above it). */
  gaugeResolutionBar: number;
};

export type AttachmentDto = {
  id: string;
  ownerKind: import('../schemas/attachments').AttachmentOwnerKind;
  ownerId: string;
  fileName: string;
  contentType: string;
  sizeBytes: number;
  uploadedBy: string | null;
  uploadedById: string | null;
  createdAt: string;
  downloadUrl: string;
};
