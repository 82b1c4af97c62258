import type { CartridgeTypeFigures as Figures } from '@shared/adapters/equipment';
import { useUnits } from '@/lib/units';
import { DerivedFigure, quantityParts, scientific } from './derived-figure';

type Spec = { waterFlowLhPer10in: number; waterDpBar: number; areaM2Per10in: number; designFluxLhPer10in: number | null };

/** The clean-water resistance and the clean-water ΔP at the design flow, each opening to show its inputs. */
export function CartridgeTypeFigures({ figures, spec }: { figures: Figures | null; spec: Spec }) {
  const units = useUnits();
  const missing = 'Enter the area, the water flow and its ΔP.';
  return (
    <div className="grid gap-2 sm:grid-cols-2" aria-live="polite">
      <DerivedFigure
        data-testid="type-resistance"
        label="Clean-water resistance"
        value={figures ? scientific(figures.resistancePerM) : null}
        unit="1/m"
        missing={missing}
        how={
          figures
            ? `R = ΔP·A ÷ (μ·Q) with ΔP ${units.format('dp', spec.waterDpBar)}, A ${units.format('area', spec.areaM2Per10in, 3)}, Q ${units.format('flow', spec.waterFlowLhPer10in)} and water viscosity at ${figures.specTempC} °C (IAPWS); Darcy's law.`
            : ''
        }
      />
      <DerivedFigure
        data-testid="type-clean-dp"
        label="Clean-water ΔP at design flow"
        {...quantityParts(figures?.cleanWaterDpBarAtDesignFlux != null ? units.format('dp', figures.cleanWaterDpBarAtDesignFlux) : null)}
        missing={figures ? 'Enter the design flow for wine.' : missing}
        how={
          figures && spec.designFluxLhPer10in !== null
            ? `ΔP = μ·R·Q ÷ A at ${units.format('flow', spec.designFluxLhPer10in)} per 10-inch module, water at ${figures.specTempC} °C (Darcy). Wine is more viscous, so its clean ΔP is higher.`
            : ''
        }
      />
    </div>
  );
}
