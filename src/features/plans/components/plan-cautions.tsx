import { Flame, Gauge, ShieldCheck } from 'lucide-react';
import type { PlanSanitationKind } from '@shared/schemas/plans';
import { CautionPanel } from '@/components/ui/caution';

/** The risky steps of a bottling day, beside the plan that schedules them. */
export function PlanCautions({ sanitationKind }: { sanitationKind: PlanSanitationKind }) {
  return (
    <div className="grid gap-3 lg:grid-cols-3">
      <CautionPanel title={sanitationKind === 'steam' ? 'Steam – burn risk' : 'Hot water – scald risk'} icon={<Flame />}>
        <ul>
          <li>Hoses, clamps and housings get as hot as the water or steam; wear heat-resistant gloves and a face shield.</li>
          <li>Secure every hose before opening a valve, and let the line cool before handling it.</li>
        </ul>
      </CautionPanel>
      <CautionPanel title="Never open a housing under pressure" icon={<Gauge />}>
        <ul>
          <li>Vent and drain a housing before loosening its clamp or bell.</li>
          <li>Keep within the lower of the housing’s and the cartridges’ pressure and temperature ratings.</li>
        </ul>
      </CautionPanel>
      <CautionPanel title="Integrity tests run under pressure" icon={<ShieldCheck />}>
        <ul>
          <li>Raise and release the test gas slowly; stand clear of the vent and the bell.</li>
          <li>Test after cool-down, with the housing back to room temperature.</li>
        </ul>
      </CautionPanel>
      <p className="text-sm text-ink-600 lg:col-span-3">
        Every figure on this page is a planning estimate. Local codes, the equipment makers’ ratings and licensed practice govern.
      </p>
    </div>
  );
}
