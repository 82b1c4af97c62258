import { createEvents, type EventAttributes } from 'ics';
import type { PlanDto, PlanTimelineBlockDto } from '../../../shared/types/plans';
import type { Database } from '../../db/client';
import { notFound } from '../../lib/errors';
import { createToken, hashToken } from '../../lib/tokens';
import type { TenantContext } from '../../middleware/authorize';
import { createPlansService } from '../plans/plans.service';
import { createAlertsRepository } from './alerts.repository';
import { alertSettingsOf } from './alert-settings';

/** Offset of `timeZone` from UTC at the instant `utcMs`, ms (positive east of Greenwich). */
function zoneOffsetMs(utcMs: number, timeZone: string): number {
  const parts = new Intl.DateTimeFormat('en-US', {
    timeZone,
    hourCycle: 'h23',
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
    hour: '2-digit',
    minute: '2-digit',
    second: '2-digit',
  }).formatToParts(utcMs);
  const get = (t: string) => Number(parts.find((p) => p.type === t)?.value);
  return Date.UTC(get('year'), get('month') - 1, get('day'), get('hour'), get('minute'), get('second')) - Math.floor(utcMs / 1000) * 1000;
}

/** The UTC instant of a wall-clock time in `timeZone`; the wall time is given as ms whose UTC fields are the local fields. */
export function wallTimeToUtc(wallMs: number, timeZone: string): number {
  let utc = wallMs - zoneOffsetMs(wallMs, timeZone);
  utc = wallMs - zoneOffsetMs(utc, timeZone);
  return utc;
}

const utcArray = (ms: number): [number, number, number, number, number] => {
  const d = new Date(ms);
  return [d.getUTCFullYear(), d.getUTCMonth() + 1, d.getUTCDate(), d.getUTCHours(), d.getUTCMinutes()];
};

/** Safety words for steps that can hurt; the plan's own notes and local codes come first. */
function cautionOf(block: PlanTimelineBlockDto, plan: PlanDto): string {
  switch (block.kind) {
    case 'sanitation':
      return plan.sanitationKind === 'steam'
        ? 'Steam: burns and pressure. Wear protective gear, open valves slowly, stay within the housings\u2019 and cartridges\u2019 rated temperature and pressure, and follow local codes.'
        : 'Hot water: scalding risk. Wear protective gear, check hoses and clamps, stay within the makers\u2019 rated temperatures, and follow local codes.';
    case 'integrity-before':
    case 'integrity-after':
      return 'Test gas under pressure: check the regulator and vent slowly; keep CO\u2082/N\u2082 areas ventilated.';
    case 'push-out':
      return 'Gas push-out: vent housings slowly and keep the area ventilated (CO\u2082/N\u2082).';
    default:
      return '';
  }
}

/** A bottling day's steps as calendar events, at the winery's time zone turned to UTC. */
export function planEvents(plan: PlanDto, wineryName: string, timeZone: string, appUrl: string): EventAttributes[] {
  const url = `${appUrl}/plans/${plan.id}`;
  const blocks = plan.timeline?.blocks ?? [];
  if (!blocks.length) {
    // No timeline yet (no line or no lots): the day itself, all day.
    const [y, m, d] = plan.plannedDate.split('-').map(Number);
    return [
      {
        uid: `${plan.id}-day@porewise`,
        title: `Bottling: ${plan.name}`,
        start: [y, m, d],
        end: utcArray(Date.UTC(y, m - 1, d + 1)).slice(0, 3) as [number, number, number],
        description: `${wineryName}. ${plan.timelineError ?? 'The day\u2019s timeline is not planned yet.'}\n${url}`,
        url,
        calName: `${wineryName} bottling days`,
      },
    ];
  }
  return blocks.map((b, i) => {
    const lot = b.planLotId ? plan.lots.find((l) => l.id === b.planLotId) : undefined;
    const caution = cautionOf(b, plan);
    return {
      uid: `${plan.id}-${i}@porewise`,
      title: `${b.label}${lot ? ` \u2014 ${lot.lot.code}` : ''} (${plan.name})`,
      start: utcArray(wallTimeToUtc(b.startMs, timeZone)),
      startInputType: 'utc',
      startOutputType: 'utc',
      end: utcArray(wallTimeToUtc(b.endMs, timeZone)),
      endInputType: 'utc',
      endOutputType: 'utc',
      description: [`${wineryName}, ${plan.name} (${plan.plannedDate}, times in ${timeZone}).`, caution, url].filter(Boolean).join('\n'),
      location: plan.line?.name,
      url,
      categories: ['Porewise', b.kind],
    } satisfies EventAttributes;
  });
}

function toIcs(events: EventAttributes[], calName: string): string {
  const { error, value } = createEvents(events, { calName, productId: 'porewise/calendar' });
  if (error || !value) throw error ?? new Error('calendar could not be written');
  return value;
}

export function createCalendarService({ db, appUrl }: { db: Database; appUrl: string }) {
  const repo = createAlertsRepository(db);
  const plans = createPlansService(db);

  return {
    /** One plan's day as an .ics file. */
    async planCalendar(tenant: TenantContext, planId: string) {
      const plan = await plans.get(tenant, planId);
      const winery = await repo.winery(tenant.wineryId);
      if (!winery) throw notFound('Winery');
      const { timeZone } = alertSettingsOf(winery.settings);
      return { ics: toIcs(planEvents(plan, winery.name, timeZone, appUrl), `${winery.name}: ${plan.name}`), fileName: `${plan.plannedDate}-${plan.id.slice(0, 8)}.ics` };
    },
    /** Creates or rotates the person's secret feed URL; the old one stops working at once. */
    async rotateFeed(userId: string) {
      const token = createToken();
      await repo.setFeed(userId, await hashToken(token));
      return { url: `${appUrl}/api/calendar/${token}` };
    },
    /** Approved bottling days of all the person's wineries; null when the token is unknown. */
    async feed(token: string): Promise<string | null> {
      if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return null;
      const feed = await repo.feedByHash(await hashToken(token));
      if (!feed) return null;
      const rows = await repo.feedPlans(feed.userId);
      const wineries = new Map<string, { name: string; timeZone: string }>();
      const events: EventAttributes[] = [];
      for (const row of rows) {
        if (!wineries.has(row.wineryId)) {
          const w = await repo.winery(row.wineryId);
          if (!w) continue;
          wineries.set(row.wineryId, { name: w.name, timeZone: alertSettingsOf(w.settings).timeZone });
        }
        const w = wineries.get(row.wineryId)!;
        const plan = await plans.get({ wineryId: row.wineryId, role: row.role, userId: feed.userId }, row.id).catch(() => null);
        if (plan) events.push(...planEvents(plan, w.name, w.timeZone, appUrl));
      }
      return toIcs(events, 'Porewise bottling days');
    },
  };
}
