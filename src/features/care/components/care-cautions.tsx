import { FlaskConical, Gauge, Thermometer } from 'lucide-react';
import { CautionPanel } from '@/components/ui/caution';

const estimates = 'Figures here are planning estimates; the cartridge and housing makers\u2019 instructions and your local rules govern.';

export function HeatCaution() {
  return (
    <CautionPanel title="Hot water and steam scald" icon={<Thermometer />}>
      <ul>
        <li>Hoses, housings and valves get hot enough to burn: wear gloves and keep skin clear of fittings and drains.</li>
        <li>Use hoses rated for the temperature and pressure; open steam slowly.</li>
        <li>Let the line cool before you open anything or test integrity.</li>
      </ul>
      <p className="mt-1">{estimates}</p>
    </CautionPanel>
  );
}

export function ChemicalCaution() {
  return (
    <CautionPanel title="Caustic and acid burn eyes and skin" icon={<FlaskConical />}>
      <ul>
        <li>Wear eye protection and chemical gloves when you mix and pump cleaning agents.</li>
        <li>Never mix caustic and acid, or either with chlorine products.</li>
        <li>Rinse until the water runs neutral before the cartridge sees wine again.</li>
      </ul>
      <p className="mt-1">{estimates}</p>
    </CautionPanel>
  );
}

export function PressureCaution() {
  return (
    <CautionPanel title="The housing is under pressure during the test" icon={<Gauge />}>
      <ul>
        <li>Never open a housing that is under pressure; stay within its and the cartridge’s pressure ratings.</li>
        <li>Release pressure slowly and stand clear of vents and drains.</li>
        <li>Use compressed air or nitrogen, not CO₂.</li>
      </ul>
      <p className="mt-1">{estimates}</p>
    </CautionPanel>
  );
}
