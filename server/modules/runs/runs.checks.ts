import { formatNumber } from '../../../shared/engine';
import { overridableBlockCodes, type RunBlockCode, type RunBlockReason } from '../../../shared/schemas/runs';
import type { PlanTrainStage } from '../../db/schema';
import { lifeFromHistory } from '../cartridges/cartridges.service';
import type { CartridgeRow, CartridgeTypeRow, HousingRow } from '../cartridges/cartridges.repository';

type Installed = { cartridge: CartridgeRow; type: CartridgeTypeRow };
type HistoryEvent = { cartridgeId: string; kind: string; at: Date; details: Record<string, unknown> | null };

const stageLabel = (stage: PlanTrainStage, index: number) => `stage ${String(index + 1)}${stage.name ? ` (${stage.name})` : ''}`;

/** The latest integrity result of a cartridge, or null when it was never tested. */
export function latestIntegrity(events: HistoryEvent[]): { pass: boolean; at: Date } | null {
  let latest: { pass: boolean; at: Date } | null = null;
  for (const e of events) {
    if (e.kind !== 'integrity' || typeof e.details?.pass !== 'boolean') continue;
    if (!latest || e.at.getTime() >= latest.at.getTime()) latest = { pass: e.details.pass, at: e.at };
  }
  return latest;
}

/**
 * Why a run cannot start on what is physically in the train's housings: one plain reason
 * per problem, each saying what to do. Empty list when everything matches the plan.
 */
export function startChecks(p: {
  stages: PlanTrainStage[];
  housings: HousingRow[];
  installed: Installed[];
  events: HistoryEvent[];
  plannedTypeNames: Map<string, string>;
  now: Date;
}): RunBlockReason[] {
  const reasons: RunBlockReason[] = [];
  const add = (stageIndex: number, code: RunBlockCode, message: string) => reasons.push({ stageIndex, code, message });
  const servedBy = new Map<string, number>();
  p.stages.forEach((stage, index) => {
    const label = stageLabel(stage, index);
    const housing = p.housings.find((h) => h.id === stage.housingId);
    const planned = p.plannedTypeNames.get(stage.cartridgeTypeId) ?? 'the planned type';
    if (!housing) {
      add(index, 'no_housing', `The housing of ${label} is no longer in the equipment list. Choose a housing for this stage in the plan.`);
      return;
    }
    const first = servedBy.get(housing.id);
    if (first !== undefined) {
      add(index, 'housing_shared', `${housing.name} already serves stage ${String(first + 1)}; one housing cannot filter two stages. Choose another housing for ${label} in the plan.`);
      return;
    }
    servedBy.set(housing.id, index);
    const here = p.installed.filter((i) => i.cartridge.housingId === housing.id);
    const inUse = here.filter((i) => i.cartridge.status !== 'retired');
    if (inUse.length === 0) {
      add(index, 'housing_empty', `${housing.name} (${label}) holds no cartridge. Install ${String(housing.rounds)} × ${planned} before starting.`);
    } else if (inUse.length < housing.rounds) {
      add(
        index,
        'housing_partial',
        `${housing.name} (${label}) holds ${String(inUse.length)} of ${String(housing.rounds)} cartridges. Fill the free rounds with ${planned}, or start anyway with a written reason (cellar master or owner).`,
      );
    }
    const wrong = inUse.filter((i) => i.type.id !== stage.cartridgeTypeId);
    if (wrong.length > 0) {
      const names = [...new Set(wrong.map((i) => i.type.name))].join(', ');
      add(
        index,
        'type_mismatch',
        `${housing.name} holds ${names}, but the plan asks for ${planned} in ${label}. Install ${planned}, or plan with what is installed.`,
      );
    }
    for (const { cartridge: c, type } of here) {
      if (c.status === 'retired') {
        add(index, 'cartridge_retired', `${c.serial} in ${housing.name} is retired. Take it out and install a good cartridge.`);
        continue;
      }
      const history = p.events.filter((e) => e.cartridgeId === c.id);
      const integrity = latestIntegrity(history);
      if (integrity && !integrity.pass) {
        add(
          index,
          'integrity_failed',
          `${c.serial} in ${housing.name} failed its latest integrity test (${integrity.at.toISOString().slice(0, 10)}). Re-wet and re-test it, or replace it; a failed test cannot be overridden.`,
        );
        continue;
      }
      const { life } = lifeFromHistory(type, c, history.map((e) => ({ kind: e.kind as 'note', at: e.at, details: e.details ?? {} })), p.now);
      if (life?.ended) {
        const why = life.endedBecause.length ? life.endedBecause.join('; ') : 'its life forecast has ended';
        add(index, 'cartridge_spent', `${c.serial} in ${housing.name} is spent: ${why}. Replace it, or start anyway with a written reason (cellar master or owner).`);
      }
    }
  });
  return reasons;
}

export const isOverridable = (code: string) => (overridableBlockCodes as readonly string[]).includes(code);

/** Cycles a cartridge had: steam + hot water + chemical (backflushes are not counted on the cartridge). */
export const cyclesOf = (c: Pick<CartridgeRow, 'steamCycles' | 'hotWaterCycles' | 'chemicalCycles'>) => c.steamCycles + c.hotWaterCycles + c.chemicalCycles;

/** Litres as text for messages. */
export const litresText = (v: number) => `${formatNumber(v, 0)} L`;
