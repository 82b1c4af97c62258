import { Plus, Wine } from 'lucide-react';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { Card } from '@/components/ui/card';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { useCan } from '@/lib/session';
import { useLots } from '../api/get-lots';
import { useTanks } from '../api/get-tanks';
import { LotFormDialog } from './lot-form-dialog';
import { LotsTable } from './lots-table';
import { TankFormDialog } from './tank-form-dialog';
import { TanksSection } from './tanks-section';

/** Cellar: the winery's lots with their readiness, and its tanks. */
export function CellarPage() {
  const mayEdit = useCan('cellar:edit');
  const [addingLot, setAddingLot] = useState(false);
  const [addingTank, setAddingTank] = useState(false);
  // One lot and one tank are enough to know whether this winery has started.
  const anyLot = useLots({ pageSize: 1 });
  const anyTank = useTanks({ pageSize: 1 });

  const addLot = (
    <Button icon={<Plus aria-hidden="true" className="size-4" />} onClick={() => setAddingLot(true)}>
      Add lot
    </Button>
  );
  const addTank = (
    <Button variant="secondary" icon={<Plus aria-hidden="true" className="size-4" />} onClick={() => setAddingTank(true)}>
      Add tank
    </Button>
  );

  const noLots = anyLot.data?.total === 0;
  const noTanks = anyTank.data?.total === 0;

  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Cellar"
        description="Wine lots and their readiness for membrane filtration, from the latest lab result of each."
        actions={mayEdit ? addLot : null}
      />
      {anyLot.isPending || anyTank.isPending ? (
        <LoadingState />
      ) : anyLot.isError ? (
        <ErrorState message={anyLot.error.message} onRetry={() => anyLot.refetch()} />
      ) : noLots && noTanks ? (
        <EmptyState
          icon={<Wine />}
          title="Your cellar is empty"
          action={
            mayEdit ? (
              <>
                {addTank}
                {addLot}
              </>
            ) : null
          }
        >
          {mayEdit
            ? 'Start with your tanks (name and capacity), then add the wine lots in them: code, style, volume, alcohol and the temperature expected at filtration. Lab results follow on each lot’s page.'
            : 'Nobody has entered tanks or lots for this winery yet. The owner, cellar master or winemaker adds them.'}
        </EmptyState>
      ) : (
        <>
          <Card title="Lots" description="Readiness uses the latest lab result of each lot." className="overflow-visible">
            {noLots ? (
              <EmptyState title="No lots yet" action={mayEdit ? addLot : null}>
                Add the wine lots in your tanks. Each lot gets a readiness verdict once its first lab result is in.
              </EmptyState>
            ) : (
              <LotsTable />
            )}
          </Card>
          <TanksSection onAddTank={() => setAddingTank(true)} />
        </>
      )}
      <LotFormDialog open={addingLot} onClose={() => setAddingLot(false)} />
      <TankFormDialog open={addingTank} onClose={() => setAddingTank(false)} />
    </div>
  );
}
