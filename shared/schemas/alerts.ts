import { z } from 'zod';
import { ALERT_CHANNELS, ALERT_KINDS, isTimeZone } from '../engine';

/** `GET /api/notifications?unread=true&page=` */
export const notificationsQuerySchema = z.object({
  unread: z
    .enum(['true', 'false'], { error: 'unread is true or false.' })
    .optional()
    .transform((v) => v === 'true'),
  page: z.coerce.number({ error: 'Page is a number.' }).int().min(1, { error: 'Pages start at 1.' }).max(10_000).default(1),
});
export type NotificationsQuery = z.infer<typeof notificationsQuerySchema>;

/** `PUT /api/me/alert-preferences`: a channel for each kind given (kinds left out keep the role's default). */
export const alertPreferencesInputSchema = z.object({
  items: z
    .array(
      z.object({
        kind: z.enum(ALERT_KINDS, { error: `Kind is one of: ${ALERT_KINDS.join(', ')}.` }),
        channel: z.enum(ALERT_CHANNELS, { error: 'Choose in the app, e-mail at once, daily digest or off.' }),
      }),
    )
    .max(ALERT_KINDS.length * 2)
    .refine((items) => new Set(items.map((i) => i.kind)).size === items.length, { error: 'Each kind of alert at most once.' }),
});
export type AlertPreferencesInput = z.infer<typeof alertPreferencesInputSchema>;

export const ORDER_LEAD_DAYS_MAX = 365;

/** The winery's alert settings (part of the winery settings). */
export const timeZoneSchema = z
  .string()
  .trim()
  .min(1)
  .max(64)
  .refine(isTimeZone, { error: 'Enter a time zone name such as Europe/Paris or America/Los_Angeles.' });
export const orderLeadTimeDaysSchema = z.coerce
  .number({ error: 'Enter a number of days.' })
  .int({ error: 'Whole days.' })
  .min(0, { error: 'At least 0 days.' })
  .max(ORDER_LEAD_DAYS_MAX, { error: `At most ${ORDER_LEAD_DAYS_MAX} days.` });
