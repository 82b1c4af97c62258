import { Gauge } from 'lucide-react';
import { CautionPanel } from '@/components/ui/caution';
import { useUnits } from '@/lib/units';

/** Shown wherever a housing is about to be opened. */
export function HousingCaution({ maxPressureBar, maxTempC }: { maxPressureBar?: number; maxTempC?: number }) {
  const units = useUnits();
  return (
    <CautionPanel title="Never open a housing under pressure" icon={<Gauge />}>
      Close the valves, vent and drain the housing before loosening the bowl. Wear eye protection; a housing that was steamed or
      rinsed hot stays hot.
      {maxPressureBar !== undefined && maxTempC !== undefined ? (
        <> This housing is rated to {units.format('pressure', maxPressureBar)} and {units.format('temperature', maxTempC, 0)}; keep within it and within the cartridge&rsquo;s own ratings.</>
      ) : (
        <> Keep within the housing&rsquo;s and the cartridge&rsquo;s ratings.</>
      )}
    </CautionPanel>
  );
}
