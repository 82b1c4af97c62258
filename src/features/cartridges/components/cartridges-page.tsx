import { FileSpreadsheet, PackagePlus } from 'lucide-react';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { buttonClasses, Button } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { paths } from '@/config/paths';
import { useCan } from '@/lib/session';
import { useCartridgeSummary } from '../api/get-cartridge-summary';
import { useHousingView } from '../api/get-housing-view';
import { CartridgeInventory } from './cartridge-inventory';
import { HousingView } from './housing-view';
import { RegisterCartridgeDialog } from './register-cartridge-dialog';
import { StockSummary } from './stock-summary';

/** The winery's cartridges: stock per type, what sits in each housing, and the inventory. */
export function CartridgesPage() {
  const mayRegister = useCan('cartridges:register');
  const summary = useCartridgeSummary();
  const view = useHousingView();
  const [registering, setRegistering] = useState(false);

  const types = (summary.data?.types ?? []).map((t) => ({ id: t.typeId, name: t.typeName }));
  const housings = (view.data?.housings ?? []).map((h) => ({ id: h.id, name: h.name }));
  const totals = summary.data?.totals;
  const count = totals ? totals.inStock.count + totals.installed.count + totals.regenerating.count + totals.retired.count : 0;

  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Cartridges"
        description="Every filter cartridge by serial and batch: where it is, what it has filtered, its care cycles and how much life it has left."
        actions={
          mayRegister ? (
            <>
              <Button icon={<PackagePlus />} onClick={() => setRegistering(true)} disabled={types.length === 0}>
                Register cartridge
              </Button>
              <Link to={paths.cartridgeImport} className={buttonClasses('secondary', 'md')}>
                <FileSpreadsheet aria-hidden="true" />
                Import delivery
              </Link>
            </>
          ) : null
        }
      />
      {summary.isPending || view.isPending ? (
        <LoadingState />
      ) : summary.isError ? (
        <ErrorState message={summary.error.message} onRetry={() => summary.refetch()} />
      ) : view.isError ? (
        <ErrorState message={view.error.message} onRetry={() => view.refetch()} />
      ) : summary.data.types.length === 0 ? (
        <EmptyState title="No cartridge types yet">
          Start under Equipment: add the cartridge types you use (rating, area, clean-water flow, rated cycles) and your housings. Then register
          cartridges here one by one, or import a delivery list.
        </EmptyState>
      ) : (
        <>
          {count === 0 ? (
            <EmptyState
              title="No cartridges registered yet"
              action={
                mayRegister ? (
                  <Link to={paths.cartridgeImport} className={buttonClasses('primary', 'lg')}>
                    Import a delivery list
                  </Link>
                ) : null
              }
            >
              Import the delivery note of your cartridges as a CSV file (serial, batch, type, length, received), or register them one by one.
            </EmptyState>
          ) : (
            <StockSummary summary={summary.data} />
          )}
          <HousingView view={view.data} />
          {count > 0 ? <CartridgeInventory types={types} housings={housings} /> : null}
        </>
      )}
      <RegisterCartridgeDialog open={registering} onClose={() => setRegistering(false)} types={types} />
    </div>
  );
}
