import { useEffect, useId, useState } from 'react';
import type { PlanDto } from '@shared/types/plans';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormField } from '@/components/ui/form-field';
import { NumberInput } from '@/components/ui/input';
import { Select } from '@/components/ui/select';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { ApiError, errorMessage } from '@/lib/api-client';
import { useUnits } from '@/lib/units';
import { useAddPlanLot } from '../api/add-plan-lot';
import { useLotOptions } from '../api/get-lot-options';
import { parseNumberText } from '@/lib/number-input';

const verdictWords = { ready: 'ready', borderline: 'borderline', 'not-ready': 'not ready', unknown: 'no verdict' } as const;

/** Adds a lot of the cellar to the end of the day. */
export function AddLotDialog({ plan, open, onClose }: { plan: PlanDto; open: boolean; onClose: () => void }) {
  const id = useId();
  const units = useUnits();
  const lots = useLotOptions(open);
  const add = useAddPlanLot();
  const [lotId, setLotId] = useState('');
  const [volume, setVolume] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  useEffect(() => {
    if (open) {
      setLotId('');
      setVolume('');
      setErrors({});
    }
  }, [open]);
  const inPlan = new Set(plan.lots.map((l) => l.lot.id));
  const options = (lots.data?.items ?? []).filter((l) => !inPlan.has(l.id));
  const chosen = options.find((l) => l.id === lotId);

  const onSubmit = async (event: React.FormEvent) => {
    event.preventDefault();
    const typed = parseNumberText(volume) ?? undefined;
    if (!lotId) return setErrors({ lotId: 'Choose a lot from the cellar.' });
    if (typed !== undefined && !(typed > 0)) return setErrors({ volumeL: 'The volume to bottle must be more than 0.' });
    try {
      await add.mutateAsync({ planId: plan.id, input: { lotId, volumeL: typed === undefined ? undefined : units.fromInput('volume', typed) } });
      onClose();
    } catch (error) {
      setErrors(error instanceof ApiError && Object.keys(error.fields).length ? error.fields : { _: errorMessage(error) });
    }
  };

  return (
    <Dialog
      open={open}
      onClose={onClose}
      title="Add a lot"
      description="It goes at the end of the day; move it up afterwards."
      footer={
        <>
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" form={`${id}-form`} loading={add.isPending}>
            Add lot
          </Button>
        </>
      }
    >
      {lots.isPending ? (
        <LoadingState />
      ) : lots.isError ? (
        <ErrorState message={errorMessage(lots.error)} onRetry={() => lots.refetch()} />
      ) : (
        <form id={`${id}-form`} onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
          {errors._ ? <p role="alert" className="text-sm font-semibold text-stop-700">{errors._}</p> : null}
          <FormField label="Lot" htmlFor={`${id}-lot`} error={errors.lotId} hint={options.length === 0 ? 'Every lot of the cellar is in this plan, or the cellar has none yet.' : undefined}>
            <Select
              id={`${id}-lot`}
              data-autofocus
              value={lotId}
              onChange={(e) => setLotId(e.target.value)}
              placeholder="Choose a lot"
              options={options.map((l) => ({ value: l.id, label: `${l.code} · ${l.name} (${verdictWords[l.readiness.verdict]})` }))}
            />
          </FormField>
          <FormField
            label="Volume to bottle"
            htmlFor={`${id}-vol`}
            error={errors.volumeL}
            hint={chosen ? `Leave empty to bottle the whole lot: ${units.format('volume', chosen.volumeL)}.` : 'Leave empty to bottle the whole lot.'}
          >
            <NumberInput id={`${id}-vol`} unit={units.symbol('volume')} value={volume} onChange={(e) => setVolume(e.target.value)} />
          </FormField>
        </form>
      )}
    </Dialog>
  );
}
