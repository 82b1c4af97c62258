import { useEffect, useState } from 'react';
import type { HousingViewHousingDto } from '@shared/types/cartridges';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { Select } from '@/components/ui/select';
import { useToast } from '@/components/ui/toast';
import { FormMessage } from '@/components/ui/form-message';
import { errorMessage } from '@/lib/api-client';
import { useCartridges } from '../api/get-cartridges';
import { useInstallCartridge } from '../api/install-cartridge';
import { HousingCaution } from './housing-caution';

/** From the housing view: choose a cartridge in stock, of the housing's length, for one free round. */
export function InstallIntoRoundDialog({ target, onClose }: { target: { housing: HousingViewHousingDto; position: number } | null; onClose: () => void }) {
  const [q, setQ] = useState('');
  const [cartridgeId, setCartridgeId] = useState('');
  const [error, setError] = useState<string | null>(null);
  const install = useInstallCartridge();
  const toast = useToast();
  const stock = useCartridges({ status: 'in-stock', lengthIn: target?.housing.lengthIn, q: q.trim() || undefined, pageSize: 50, sort: 'serial' }, { enabled: Boolean(target) });
  const options = stock.data?.items ?? [];

  useEffect(() => {
    setError(null);
    setCartridgeId('');
    setQ('');
  }, [target]);
  useEffect(() => {
    if (options.length && !options.some((o) => o.id === cartridgeId)) setCartridgeId(options[0].id);
  }, [stock.data]);

  if (!target) return null;
  const { housing, position } = target;
  const submit = () => {
    if (!cartridgeId) {
      setError('Choose a cartridge.');
      return;
    }
    install.mutate(
      { id: cartridgeId, housingId: housing.id, position },
      {
        onSuccess: (c) => {
          toast.success('Installed', `${c.serial} is in ${housing.name}, round ${position}.`);
          onClose();
        },
        onError: (e) => setError(errorMessage(e, { preferField: true })),
      },
    );
  };

  return (
    <Dialog
      open
      onClose={onClose}
      title={`Install into ${housing.name}, round ${position}`}
      description={`Cartridges in stock that are ${housing.lengthIn} inches long.`}
      footer={
        <>
          <Button variant="secondary" size="lg" onClick={onClose}>
            Cancel
          </Button>
          <Button size="lg" loading={install.isPending} onClick={submit} disabled={!cartridgeId}>
            Install cartridge
          </Button>
        </>
      }
    >
      <div className="flex flex-col gap-4">
        <FormMessage message={error} />
        <FormField label="Find by serial or batch" htmlFor="round-search">
          <Input id="round-search" type="search" value={q} onChange={(e) => setQ(e.target.value)} />
        </FormField>
        <FormField
          label="Cartridge"
          htmlFor="round-cartridge"
          hint={stock.data && stock.data.total > options.length ? `Showing ${options.length} of ${stock.data.total}; search to narrow down.` : undefined}
        >
          <Select
            id="round-cartridge"
            value={cartridgeId}
            onChange={(e) => setCartridgeId(e.target.value)}
            placeholder={stock.isPending ? 'Loading …' : options.length ? undefined : `No ${housing.lengthIn}-inch cartridge in stock`}
            options={options.map((c) => ({ value: c.id, label: `${c.serial} — ${c.typeName}${c.batch ? `, batch ${c.batch}` : ''}` }))}
          />
        </FormField>
        <HousingCaution maxPressureBar={housing.maxPressureBar} maxTempC={housing.maxTempC} />
      </div>
    </Dialog>
  );
}
