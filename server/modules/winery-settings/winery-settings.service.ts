import { defaultReadinessThresholds, GAUGE_RESOLUTION_BAR_DEFAULT, readinessThresholdsSchema, type ReadinessThresholds } from '../../../shared/engine';
import type { UpdateWinerySettingsInput } from '../../../shared/schemas/winery-settings';
import type { WinerySettingsDto } from '../../../shared/types/api';
import type { DbOrTx } from '../../db/client';
import { notFound } from '../../lib/errors';
import { alertSettingsOf } from '../alerts/alert-settings';
import { createWinerySettingsRepository } from './winery-settings.repository';
import { audited } from '../audit/audit.service';

function thresholdsFrom(settings: Record<string, unknown>): ReadinessThresholds | null {
  const parsed = readinessThresholdsSchema.safeParse(settings.readinessThresholds);
  return parsed.success ? parsed.data : null;
}

/** The gauge resolution a winery set, bar, or the engine's default (0.02 bar). */
function gaugeResolutionOf(settings: Record<string, unknown>): number {
  const v = settings.gaugeResolutionBar;
  return typeof v === 'number' && Number.isFinite(v) && v > 0 ? v : GAUGE_RESOLUTION_BAR_DEFAULT;
}

/** The gauge resolution a winery uses for its runs' fouling checks, bar. */
export async function gaugeResolutionFor(db: DbOrTx, wineryId: string): Promise<number> {
  const winery = await createWinerySettingsRepository(db).find(wineryId);
  return winery ? gaugeResolutionOf(winery.settings) : GAUGE_RESOLUTION_BAR_DEFAULT;
}

/** The readiness thresholds a winery uses: its own, or the defaults. */
export async function readinessThresholdsFor(db: DbOrTx, wineryId: string): Promise<ReadinessThresholds> {
  const winery = await createWinerySettingsRepository(db).find(wineryId);
  return (winery && thresholdsFrom(winery.settings)) ?? defaultReadinessThresholds;
}

export function createWinerySettingsService(db: DbOrTx) {
  const repo = createWinerySettingsRepository(db);
  async function get(wineryId: string): Promise<WinerySettingsDto> {
    const winery = await repo.find(wineryId);
    if (!winery) throw notFound('Winery');
    const own = thresholdsFrom(winery.settings);
    return {
      wineryId,
      name: winery.name,
      readinessThresholds: own ?? defaultReadinessThresholds,
      readinessThresholdsAreDefault: own === null,
      defaultReadinessThresholds,
      ...alertSettingsOf(winery.settings),
      gaugeResolutionBar: gaugeResolutionOf(winery.settings),
    };
  }
  return {
    get,
    async update(wineryId: string, input: UpdateWinerySettingsInput, actorId: string | null = null) {
      const winery = await repo.find(wineryId);
      if (!winery) throw notFound('Winery');
      const settings = { ...winery.settings };
      if (input.readinessThresholds === null) delete settings.readinessThresholds;
      else if (input.readinessThresholds) settings.readinessThresholds = input.readinessThresholds;
      if (input.timeZone !== undefined) settings.timeZone = input.timeZone;
      if (input.orderLeadTimeDays !== undefined) settings.orderLeadTimeDays = input.orderLeadTimeDays;
      if (input.gaugeResolutionBar !== undefined) settings.gaugeResolutionBar = input.gaugeResolutionBar;
      await audited(db, { wineryId, userId: actorId }, { action: 'update', kind: 'settings', id: wineryId }, (tx) => createWinerySettingsRepository(tx).update(wineryId, { name: input.name, settings }));
      return get(wineryId);
    },
  };
}
