/** Order lead time when the winery has not set one, days (the example). */
export const DEFAULT_ORDER_LEAD_DAYS = 10;
export const DEFAULT_TIME_ZONE = 'UTC';

/** A winery's alert settings from its settings object: IANA time zone and order lead time. */
export function alertSettingsOf(settings: Record<string, unknown>) {
  const timeZone = typeof settings.timeZone === 'string' ? settings.timeZone : DEFAULT_TIME_ZONE;
  const lead = settings.orderLeadTimeDays;
  return { timeZone, orderLeadTimeDays: typeof lead === 'number' && Number.isFinite(lead) ? lead : DEFAULT_ORDER_LEAD_DAYS };
}

