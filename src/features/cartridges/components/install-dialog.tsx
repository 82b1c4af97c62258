import { useEffect, useState } from 'react';
import type { CartridgeDto } from '@shared/types/cartridges';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormField } from '@/components/ui/form-field';
import { Select } from '@/components/ui/select';
import { LoadingState } from '@/components/ui/states';
import { useToast } from '@/components/ui/toast';
import { FormMessage } from '@/components/ui/form-message';
import { errorMessage } from '@/lib/api-client';
import { useHousingView } from '../api/get-housing-view';
import { useInstallCartridge } from '../api/install-cartridge';
import { HousingCaution } from './housing-caution';

/** Install (or move) one cartridge: choose a housing of its length and a free round. */
export function InstallDialog({ cartridge, open, onClose }: { cartridge: CartridgeDto; open: boolean; onClose: () => void }) {
  const view = useHousingView();
  const install = useInstallCartridge();
  const toast = useToast();
  const [housingId, setHousingId] = useState('');
  const [position, setPosition] = useState('');
  const [error, setError] = useState<string | null>(null);

  const fitting = (view.data?.housings ?? []).filter((h) => h.lengthIn === cartridge.lengthIn);
  const housing = fitting.find((h) => h.id === housingId);
  const freeRounds = housing ? housing.positions.filter((p) => !p.cartridge || p.cartridge.id === cartridge.id).map((p) => p.position) : [];

  useEffect(() => {
    if (!open) return;
    setError(null);
    setPosition('');
    const firstFree = fitting.find((h) => h.freeRounds > 0);
    setHousingId((current) => current || firstFree?.id || '');
  }, [open, view.data]);

  const submit = () => {
    setError(null);
    if (!housingId) {
      setError('Choose a housing.');
      return;
    }
    install.mutate(
      { id: cartridge.id, housingId, position: position ? Number(position) : undefined },
      {
        onSuccess: (c) => {
          toast.success('Installed', `${c.serial} is in ${c.housingName}, round ${c.position}.`);
          onClose();
        },
        onError: (e) => setError(errorMessage(e, { preferField: true })),
      },
    );
  };

  return (
    <Dialog
      open={open}
      onClose={onClose}
      title={`Install ${cartridge.serial}`}
      description={`${cartridge.lengthIn}-inch ${cartridge.typeName}. Only housings that take ${cartridge.lengthIn}-inch cartridges are listed.`}
      footer={
        <>
          <Button variant="secondary" size="lg" onClick={onClose}>
            Cancel
          </Button>
          <Button size="lg" loading={install.isPending} onClick={submit} disabled={fitting.length === 0}>
            Install cartridge
          </Button>
        </>
      }
    >
      {view.isPending ? (
        <LoadingState />
      ) : (
        <div className="flex flex-col gap-4">
          <FormMessage message={error} />
          {fitting.length === 0 ? (
            <p className="text-base text-ink-700">No housing takes {cartridge.lengthIn}-inch cartridges. Add one under Equipment first.</p>
          ) : (
            <>
              <FormField label="Housing" htmlFor="install-housing">
                <Select
                  id="install-housing"
                  value={housingId}
                  onChange={(e) => {
                    setHousingId(e.target.value);
                    setPosition('');
                  }}
                  placeholder="Choose a housing"
                  options={fitting.map((h) => ({
                    value: h.id,
                    label: `${h.name} — ${h.freeRounds} of ${h.rounds} rounds free`,
                    disabled: h.freeRounds === 0 && h.id !== cartridge.housingId,
                  }))}
                />
              </FormField>
              <FormField label="Round" htmlFor="install-round" hint="Leave on the first free round unless you are filling a particular one.">
                <Select
                  id="install-round"
                  value={position}
                  onChange={(e) => setPosition(e.target.value)}
                  disabled={!housing}
                  options={[{ value: '', label: 'First free round' }, ...freeRounds.map((p) => ({ value: String(p), label: `Round ${p}` }))]}
                />
              </FormField>
            </>
          )}
          <HousingCaution maxPressureBar={housing?.maxPressureBar} maxTempC={housing?.maxTempC} />
        </div>
      )}
    </Dialog>
  );
}
