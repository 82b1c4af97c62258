import {
  ALERT_KINDS,
  alertKindLabels,
  careOverTemperatureAlert,
  cartridgeDayNeed,
  defaultAlertChannel,
  endOfLifeAlerts,
  flatDpAlert,
  integrityAlert,
  isLocalHour,
  localDate,
  lotNotReadyAlert,
  runTerminalAlert,
  shouldRenotifyRunAlert,
  stockShortAlert,
  type AlertChannel,
  type AlertFinding,
  type AlertKind,
  type PlannedHousingUse,
} from '../../../shared/engine';
import type { AlertPreferencesInput, NotificationsQuery } from '../../../shared/schemas/alerts';
import type { AlertPreferencesDto, MailFailureDto, NotificationDto, NotificationsDto } from '../../../shared/types/alerts';
import type { Database, DbOrTx } from '../../db/client';
import { notFound } from '../../lib/errors';
import { logger } from '../../lib/logger';
import type { MailMessage, Mailer } from '../../lib/mail';
import type { TenantContext } from '../../middleware/authorize';
import { lifeVerdictFromHistory } from '../cartridges/cartridges.service';
import { createLifeInputsService } from '../cartridges/life-inputs.service';
import { createCellarService } from '../cellar/cellar.service';
import { createPlansService } from '../plans/plans.service';
import { createRunsService } from '../runs/runs.service';
import { alertSettingsOf } from './alert-settings';
import { createAlertsRepository, type AlertRow, type AlertsRepository } from './alerts.repository';

/**
 * The rules evaluated after each change and by the 10-minute sweep. The stock rule is not among
 * them: it is checked when a plan is approved and then once a day (see {@link STOCK_CHECK_HOUR}).
 */
const SWEPT: readonly AlertKind[] = ['integrity-failed', 'cartridge-end-of-life', 'lot-not-ready', 'run-terminal-dp', 'stage-flat-dp', 'care-over-temperature'];
/** The rules of an evaluation that includes the stock check (approval, the daily check). */
const WITH_STOCK: readonly AlertKind[] = [...SWEPT, 'stock-short'];
/** Local hour of the daily stock check in each winery's time zone: an hour before the digest, so a new shortfall is in it. */
export const STOCK_CHECK_HOUR = 6;
export const DIGEST_HOUR = 7;
export const NOTIFICATIONS_PAGE_SIZE = 20;

const key = (a: { kind: string; recordId: string; threshold: string }) => `${a.kind}|${a.recordId}|${a.threshold}`;

/** The client path of an alert's record. */
function linkOf(f: Pick<AlertFinding, 'recordType' | 'recordId'>): string {
  switch (f.recordType) {
    case 'cartridge':
      return `/cartridges/${f.recordId}`;
    case 'plan':
      return `/plans/${f.recordId}`;
    case 'run':
      return `/runs/${f.recordId}`;
    case 'lot':
      return `/cellar/lots/${f.recordId}`;
  }
}

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string);

function alertMail(appUrl: string, wineryName: string, to: string, a: Pick<AlertRow, 'title' | 'message' | 'nextStep' | 'link' | 'severity'>): MailMessage {
  const link = appUrl + a.link;
  const prefs = `${appUrl}/settings#alert-preferences`;
  const sev = a.severity === 'critical' ? 'Urgent' : a.severity === 'warning' ? 'Warning' : 'Note';
  return {
    to,
    subject: `[${wineryName}] ${sev}: ${a.title}`,
    text: `${wineryName}\n\n${a.message}\n\nNext step: ${a.nextStep}\n\nOpen the record: ${link}\n\nChoose which alerts you receive and how: ${prefs}\n`,
    html:
      `<p><strong>${escapeHtml(wineryName)}</strong></p><p>${escapeHtml(a.message)}</p>` +
      `<p><strong>Next step:</strong> ${escapeHtml(a.nextStep)}</p><p><a href="${escapeHtml(link)}">Open the record</a></p>` +
      `<p style="color:#666;font-size:12px"><a href="${escapeHtml(prefs)}">Choose which alerts you receive and how</a></p>`,
  };
}

function presentNotification(n: { notification: { id: string; readAt: Date | null; channel: string }; alert: AlertRow }): NotificationDto {
  const a = n.alert;
  return {
    id: n.notification.id,
    alertId: a.id,
    kind: a.kind as AlertKind,
    severity: a.severity,
    title: a.title,
    message: a.message,
    nextStep: a.nextStep,
    link: a.link,
    record: { type: a.recordType as NotificationDto['record']['type'], id: a.recordId },
    openedAt: a.openedAt.toISOString(),
    clearedAt: a.clearedAt?.toISOString() ?? null,
    readAt: n.notification.readAt?.toISOString() ?? null,
  };
}

type Deps = {
  db: Database;
  mailer: Mailer;
  appUrl: string;
};

/**
 * After a quiet spell the first write is evaluated at once; while writes keep coming (a run's
 * readings every second, a logger pushing hundreds), the winery is evaluated at most once in this
 * long, after the last of them. An evaluation reads every running run's figures, which a steady
 * stream of readings keeps changing; evaluated after each write, it would take a core.
 */
export const EVALUATE_GAP_MS = 2_000;

export function createAlertsService({ db, mailer, appUrl }: Deps) {
  const repo = createAlertsRepository(db);
  const plans = createPlansService(db);
  const cellar = createCellarService(db);
  const runs = createRunsService(db);
  const lifeInputs = createLifeInputsService(db);

  /** Running runs: a stage forecast to reach terminal ΔP before the lot is done, or a membrane's ΔP flat while litres rise. */
  async function runFindings(tenant: TenantContext): Promise<AlertFinding[]> {
    const out: AlertFinding[] = [];
    const { items } = await runs.list(tenant);
    for (const r of items.filter((x) => x.status === 'running')) {
      const d = await runs.detail(tenant, r.id).catch(() => null);
      if (!d) continue;
      const kinds = await repo.typeKinds(tenant.wineryId, d.stages.map((s) => s.cartridgeTypeId));
      for (const s of d.stages) {
        const name = `${s.name} (${s.cartridgeTypeName})`;
        if (s.alarm?.alarm && s.forecast) {
          const f = runTerminalAlert({ runId: d.id, stageIndex: s.index, stageName: name, lotCode: d.lotCode, litresToTerminal: s.forecast.volumeLeftL, litresLeft: d.volumeToBottleL });
          if (f) out.push(f);
        }
        const flat = flatDpAlert({
          runId: d.id,
          stageIndex: s.index,
          stageName: name,
          membrane: kinds.get(s.cartridgeTypeId) === 'membrane',
          readings: s.readings.map((x) => ({ volumeL: x.volumeL, dpBar: x.dpBar })),
        });
        if (flat) out.push(flat);
      }
    }
    return out;
  }

  /** Every condition that holds now in this winery, from stored records (engine rules); the stock rule only when asked. */
  async function findings(wineryId: string, now: Date, settings: Record<string, unknown>, opts: { stock: boolean }): Promise<AlertFinding[]> {
    const { timeZone, orderLeadTimeDays } = alertSettingsOf(settings);
    const today = localDate(now.getTime(), timeZone);
    const tenant: TenantContext = { wineryId, role: 'owner', userId: '' };
    const out: AlertFinding[] = [];
    const planIds = await repo.approvedPlanIds(wineryId, today);
    const [{ items, housings }, approved] = await Promise.all([lifeInputs.lifeInputs(wineryId, { housings: true }), plans.getMany(tenant, planIds)]);
    // Each approved day's use of each housing, for the forecast part of the end-of-life rule.
    const uses: PlannedHousingUse[] = [];
    for (const plan of approved) {
      for (const pl of plan.lots) {
        const train = pl.trains.find((t) => t.id === pl.chosenTrainId);
        train?.stages.forEach((st, i) => {
          const eq = train.sizing?.stages[i]?.elementEquivalents;
          uses.push({ planId: plan.id, plannedDate: plan.plannedDate, housingId: st.housingId, volumeL: pl.volumeL, setEquivalents: eq !== undefined && eq > 0 ? eq : null });
        });
      }
    }
    for (const row of items) {
      const { cartridge, type, history } = row;
      const { life } = lifeVerdictFromHistory(type, cartridge, history, now);
      if (!life) continue;
      const failed = integrityAlert({ cartridgeId: cartridge.id, serial: cartridge.serial, latestPass: life.integrity.latestPass });
      if (failed) out.push(failed);
      const need =
        cartridge.status === 'installed' && cartridge.housingId
          ? cartridgeDayNeed({ housingId: cartridge.housingId, cartridgeEquivalents: cartridge.lengthIn / 10, today, uses })
          : null;
      out.push(
        ...endOfLifeAlerts({
          cartridgeId: cartridge.id,
          serial: cartridge.serial,
          budgets: life.budgets,
          remainingCycles: life.remainingCycles,
          remainingLitres: life.remainingLitres,
          need,
          estimatedEndMs: life.estimatedEndMs,
          nextPlannedDate: need?.plannedDate ?? null,
        }),
      );
      // A cycle hotter than the type's or the housing's rating (logged as such, or a rating corrected
      // downwards since), until a passing integrity test after it.
      for (const e of history) {
        if (e.kind !== 'cycle' || typeof e.details?.tempC !== 'number') continue;
        if (history.some((x) => x.kind === 'integrity' && x.details?.pass === true && x.at > e.at)) continue;
        const hot = careOverTemperatureAlert({
          cartridgeId: cartridge.id,
          serial: cartridge.serial,
          cycleId: e.at.toISOString(),
          tempC: e.details.tempC,
          cartridgeMaxC: type.maxTempC,
          housingMaxC: e.housingId ? (housings.get(e.housingId)?.maxTempC ?? null) : null,
        });
        if (hot) out.push(hot);
      }
    }
    out.push(...(await runFindings(tenant)));
    if (approved.length) {
      const lots = await cellar.listLots(tenant, { q: undefined, sort: 'code', order: 'asc', page: 1, pageSize: 5000 });
      const readiness = new Map(lots.items.map((l) => [l.id, l.readiness]));
      for (const plan of approved) {
        if (opts.stock) {
          const short = stockShortAlert({
            planId: plan.id,
            planName: plan.name,
            plannedDate: plan.plannedDate,
            today,
            leadTimeDays: orderLeadTimeDays,
            shortages: plan.needs.map((n) => ({ typeName: n.typeName, lengthIn: n.lengthIn, short: n.shortfall })),
          });
          if (short) out.push(short);
        }
        for (const pl of plan.lots) {
          const r = readiness.get(pl.lot.id);
          const finding = lotNotReadyAlert({
            lotId: pl.lot.id,
            lotCode: pl.lot.code,
            planName: plan.name,
            plannedDate: plan.plannedDate,
            today,
            ready: r?.verdict === 'ready',
            reason: r?.reasons?.[0] ?? 'no lab result yet.',
          });
          if (finding) out.push(finding);
        }
      }
    }
    return out;
  }

  /**
   * Opens an alert for each new finding (one per rule, record and threshold), notifies its
   * people by their preferences — mail enqueued in the same transaction — and clears the open
   * alerts whose condition no longer holds.
   */
  async function openAndClear(tx: DbOrTx, wineryId: string, found: AlertFinding[], now: Date, opts: { clearKinds: readonly AlertKind[] }) {
    const r = createAlertsRepository(tx);
    await r.lockWinery(wineryId);
    const winery = await r.winery(wineryId);
    if (!winery) return { opened: 0, cleared: 0 };
    const open = await r.openAlerts(wineryId);
    const openKeys = new Set(open.map(key));
    const foundKeys = new Set(found.map(key));
    const stale = open.filter((a) => opts.clearKinds.includes(a.kind as AlertKind) && !foundKeys.has(key(a)));
    await r.clearAlerts(
      stale.map((a) => a.id),
      now,
    );
    const fresh = found.filter((f, i) => !openKeys.has(key(f)) && found.findIndex((g) => key(g) === key(f)) === i);
    // A run's forecast that worsened: the same alert again (at most every 30 minutes per stage).
    const openByKey = new Map(open.map((a) => [key(a), a]));
    const worse = found.flatMap((f) => {
      const prev = f.kind === 'run-terminal-dp' ? openByKey.get(key(f)) : undefined;
      const prevShort = typeof prev?.details?.shortL === 'number' ? prev.details.shortL : null;
      if (!prev || prevShort === null || f.details?.shortL === undefined) return [];
      return shouldRenotifyRunAlert({ shortL: prevShort, notifiedAtMs: prev.notifiedAt.getTime() }, { shortL: f.details.shortL, nowMs: now.getTime() }) ? [{ f, prev }] : [];
    });
    if (!fresh.length && !worse.length) return { opened: 0, cleared: stale.length };
    const members = await r.members(wineryId);
    const recipientsOf = (kind: AlertKind) =>
      members
        .map((m) => ({ m, channel: (m.prefs[kind] as AlertChannel | undefined) ?? defaultAlertChannel(m.role, kind) }))
        .filter((x): x is { m: (typeof members)[number]; channel: Exclude<AlertChannel, 'off'> } => x.channel !== 'off');
    for (const { f, prev } of worse) {
      await r.touchAlert(prev.id, { title: f.title, message: f.message, details: f.details ?? {}, notifiedAt: now, severity: f.severity });
      await r.resetNotifications(prev.id);
      for (const { m } of recipientsOf(f.kind).filter((x) => x.channel === 'email')) {
        await mailer.send(alertMail(appUrl, winery.name, m.email, { ...prev, ...f, link: prev.link }), { db: tx, wineryId });
      }
    }
    let opened = 0;
    for (const f of fresh) {
      const row = await r.insertAlert({ wineryId, ...f, details: f.details ?? {}, link: linkOf(f), openedAt: now, notifiedAt: now });
      if (!row) continue;
      opened += 1;
      const recipients = recipientsOf(f.kind);
      await r.insertNotifications(recipients.map(({ m, channel }) => ({ wineryId, alertId: row.id, userId: m.userId, channel, createdAt: now })));
      for (const { m } of recipients.filter((x) => x.channel === 'email')) {
        await mailer.send(alertMail(appUrl, winery.name, m.email, row), { db: tx, wineryId });
      }
    }
    return { opened, cleared: stale.length };
  }

  /**
   * Evaluates the winery's rules and opens or clears their alerts. The stock rule is part of it
   * only with `stock: true` (a plan approved, the daily check); otherwise its alerts are left as they are.
   */
  async function evaluate(wineryId: string, now = new Date(), opts: { stock?: boolean } = {}) {
    const winery = await repo.winery(wineryId);
    if (!winery) return { opened: 0, cleared: 0 };
    const stock = opts.stock === true;
    const found = await findings(wineryId, now, winery.settings, { stock });
    return db.transaction((tx) => openAndClear(tx, wineryId, found, now, { clearKinds: stock ? WITH_STOCK : SWEPT }));
  }

  // Evaluations after requests: one at a time per winery, starts at least EVALUATE_GAP_MS apart;
  // a request during one (or during the wait) asks for another, with the stock check when any of
  // the requests asked for it.
  const running = new Map<string, Promise<void>>();
  const again = new Map<string, boolean>();
  const lastStart = new Map<string, number>();
  function evaluateSoon(wineryId: string, opts: { stock?: boolean } = {}) {
    if (running.has(wineryId)) {
      again.set(wineryId, (again.get(wineryId) ?? false) || opts.stock === true);
      return;
    }
    again.set(wineryId, opts.stock === true);
    const run = (async () => {
      do {
        const wait = (lastStart.get(wineryId) ?? -Infinity) + EVALUATE_GAP_MS - Date.now();
        if (wait > 0) await new Promise((r) => setTimeout(r, wait));
        lastStart.set(wineryId, Date.now());
        const stock = again.get(wineryId) ?? false;
        again.delete(wineryId);
        try {
          await evaluate(wineryId, new Date(), { stock });
        } catch (error) {
          logger.error({ err: error, wineryId }, 'alert evaluation failed');
        }
      } while (again.has(wineryId));
    })().finally(() => running.delete(wineryId));
    running.set(wineryId, run);
  }

  return {
    evaluate,
    evaluateSoon,
    /** Waits for the evaluations started by requests (tests, shutdown). */
    async idle() {
      while (running.size) await Promise.allSettled([...running.values()]);
    },
    /** The scheduled sweep: every winery, one after the other (all rules but the stock check). */
    async sweep(now = new Date()) {
      for (const w of await repo.allWineries()) await evaluate(w.id, now);
    },
    /**
     * The daily stock check: each winery whose local hour is STOCK_CHECK_HOUR (or only the given
     * winery) is evaluated with the stock rule, which raises a shortfall again if it is still there
     * and clears it when it is resolved. Answers the wineries checked.
     */
    async stockCheck(nowMs: number, onlyWineryId?: string) {
      let checked = 0;
      for (const w of await repo.allWineries()) {
        if (onlyWineryId && w.id !== onlyWineryId) continue;
        if (!isLocalHour(nowMs, alertSettingsOf(w.settings).timeZone, STOCK_CHECK_HOUR)) continue;
        await evaluate(w.id, new Date(nowMs), { stock: true });
        checked += 1;
      }
      return checked;
    },

    /** The digest at DIGEST_HOUR in each winery's time zone: one mail per person with what they chose to get that way. */
    async digest(nowMs: number, onlyWineryId?: string) {
      let sent = 0;
      for (const w of await repo.allWineries()) {
        if (onlyWineryId && w.id !== onlyWineryId) continue;
        const { timeZone } = alertSettingsOf(w.settings);
        if (!isLocalHour(nowMs, timeZone, DIGEST_HOUR)) continue;
        await db.transaction(async (tx) => {
          const r = createAlertsRepository(tx);
          await r.lockWinery(w.id);
          const pending = await r.pendingDigest(w.id);
          const byPerson = new Map<string, typeof pending>();
          for (const p of pending) byPerson.set(p.email, [...(byPerson.get(p.email) ?? []), p]);
          for (const [email, items] of byPerson) {
            const lines = items.map((i) => `- ${i.alert.title}${i.alert.clearedAt ? ' (cleared since)' : ''}\n  ${i.alert.nextStep}\n  ${appUrl}${i.alert.link}`);
            const prefs = `${appUrl}/settings#alert-preferences`;
            await mailer.send(
              {
                to: email,
                subject: `[${w.name}] Porewise daily digest: ${items.length} ${items.length === 1 ? 'alert' : 'alerts'}`,
                text: `${w.name} — alerts since the last digest (${localDate(nowMs, timeZone)}, ${timeZone}):\n\n${lines.join('\n\n')}\n\nChoose which alerts you receive and how: ${prefs}\n`,
                html:
                  `<p><strong>${escapeHtml(w.name)}</strong> — alerts since the last digest</p><ul>` +
                  items.map((i) => `<li><a href="${escapeHtml(appUrl + i.alert.link)}">${escapeHtml(i.alert.title)}</a><br>${escapeHtml(i.alert.nextStep)}</li>`).join('') +
                  `</ul><p style="color:#666;font-size:12px"><a href="${escapeHtml(prefs)}">Choose which alerts you receive and how</a></p>`,
              },
              { db: tx, wineryId: w.id },
            );
            sent += 1;
          }
          await r.markDigested(
            pending.map((p) => p.notification.id),
            new Date(nowMs),
          );
        });
      }
      return sent;
    },

    async notifications(tenant: TenantContext, query: NotificationsQuery): Promise<NotificationsDto> {
      const { items, total, unread } = await repo.notifications(tenant.userId, tenant.wineryId, {
        unread: query.unread ?? false,
        limit: NOTIFICATIONS_PAGE_SIZE,
        offset: (query.page - 1) * NOTIFICATIONS_PAGE_SIZE,
      });
      return { items: items.map(presentNotification), total, unread, page: query.page, pageSize: NOTIFICATIONS_PAGE_SIZE };
    },
    async markRead(tenant: TenantContext, id: string) {
      if (!(await repo.markRead(tenant.userId, tenant.wineryId, id, new Date()))) throw notFound('Notification');
    },
    async markAllRead(tenant: TenantContext) {
      return { marked: await repo.markRead(tenant.userId, tenant.wineryId, null, new Date()) };
    },

    async preferences(tenant: TenantContext): Promise<AlertPreferencesDto> {
      const stored = new Map((await repo.preferences(tenant.userId, tenant.wineryId)).map((p) => [p.kind, p.channel]));
      return {
        items: ALERT_KINDS.map((kind) => ({
          kind,
          label: alertKindLabels[kind],
          channel: stored.get(kind) ?? defaultAlertChannel(tenant.role, kind),
          roleDefault: defaultAlertChannel(tenant.role, kind),
        })),
      };
    },
    async setPreferences(tenant: TenantContext, input: AlertPreferencesInput): Promise<AlertPreferencesDto> {
      await db.transaction((tx) =>
        createAlertsRepository(tx).setPreferences(
          tenant.userId,
          tenant.wineryId,
          input.items.filter((i) => i.channel !== defaultAlertChannel(tenant.role, i.kind)),
        ),
      );
      return this.preferences(tenant);
    },

    async mailFailures(tenant: TenantContext): Promise<{ items: MailFailureDto[] }> {
      const rows = await repo.mailFailures(tenant.wineryId);
      return {
        items: rows.map((r) => ({
          id: r.id,
          to: r.to,
          subject: r.subject,
          error: r.error,
          attempts: r.attempts,
          failedAt: r.failedAt.toISOString(),
          resentAt: r.resentAt?.toISOString() ?? null,
        })),
      };
    },
    /** Keeps a mail whose last delivery attempt failed, for the owners to see and resend (a job kept twice is kept once). */
    async keepMailFailure(failure: Parameters<AlertsRepository['insertMailFailure']>[0]) {
      await repo.insertMailFailure(failure);
    },
    /** Enqueues the mail again (with fresh retries), in the same transaction as marking it resent. */
    async resendMail(tenant: TenantContext, id: string) {
      await db.transaction(async (tx) => {
        const r = createAlertsRepository(tx);
        const row = await r.mailFailure(tenant.wineryId, id);
        if (!row) throw notFound('Mail');
        await mailer.send({ to: row.to, subject: row.subject, text: row.text, html: row.html ?? undefined }, { db: tx, wineryId: row.wineryId });
        await r.markResent(row.id, new Date());
      });
    },
  };
}
export type AlertsService = ReturnType<typeof createAlertsService>;
