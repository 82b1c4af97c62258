// Alerts, notifications, preferences and undelivered mail (the API's answers).
import type { AlertChannel, AlertKind, AlertRecordType, AlertSeverity } from '../engine';

/** One alert as it reached the signed-in person. */
export type NotificationDto = {
  id: string;
  alertId: string;
  kind: AlertKind;
  severity: AlertSeverity;
  title: string;
  message: string;
  /** What to do, in plain words. */
  nextStep: string;
  /** The client path of the record. */
  link: string;
  record: { type: AlertRecordType; id: string };
  openedAt: string;
  /** When the condition cleared itself, or null while it holds. */
  clearedAt: string | null;
  readAt: string | null;
};

export type NotificationsDto = { items: NotificationDto[]; total: number; unread: number; page: number; pageSize: number };

export type AlertPreferenceDto = { kind: AlertKind; label: string; channel: AlertChannel; roleDefault: AlertChannel };
export type AlertPreferencesDto = { items: AlertPreferenceDto[] };

/** Mail that could not be delivered after the last retry. */
export type MailFailureDto = { id: string; to: string; subject: string; error: string; attempts: number; failedAt: string; resentAt: string | null };
