import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { retireCartridgeInputSchema } from '@shared/schemas/cartridges';
import type { CartridgeDto } from '@shared/types/cartridges';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormField } from '@/components/ui/form-field';
import { Textarea } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { FormMessage } from '@/components/ui/form-message';
import { useFormSubmit } from '@/lib/form-errors';
import { useRetireCartridge } from '../api/retire-cartridge';
import { HousingCaution } from './housing-caution';

export function RetireDialog({ cartridge, open, onClose }: { cartridge: CartridgeDto; open: boolean; onClose: () => void }) {
  const retire = useRetireCartridge();
  const toast = useToast();
  const form = useForm({ resolver: zodResolver(retireCartridgeInputSchema), defaultValues: { reason: '' } });
  const { alert, submit, close } = useFormSubmit(form, {
    fields: ['reason'],
    onClose,
    save: async (values, close) => {
      await retire.mutateAsync({ id: cartridge.id, ...values });
      toast.success('Retired', `${cartridge.serial} is out of service for good.`);
      close();
    },
  });
  return (
    <Dialog
      open={open}
      onClose={close}
      title={`Retire ${cartridge.serial}?`}
      description={cartridge.housingName ? `It comes out of ${cartridge.housingName}, round ${cartridge.position}, and cannot be installed again.` : 'It cannot be installed again. Its history stays.'}
      footer={
        <>
          <Button variant="secondary" size="lg" onClick={close}>
            Keep in service
          </Button>
          <Button variant="danger" size="lg" type="submit" form="retire-form" loading={retire.isPending}>
            Retire cartridge
          </Button>
        </>
      }
    >
      <form id="retire-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
        <FormMessage message={alert} />
        <FormField label="Reason" htmlFor="retire-reason" error={form.formState.errors.reason?.message} hint="For example: failed integrity test, flow no longer recovers, rated cycles reached." required>
          <Textarea id="retire-reason" rows={3} data-autofocus {...form.register('reason')} />
        </FormField>
        {cartridge.housingName ? <HousingCaution /> : null}
      </form>
    </Dialog>
  );
}
