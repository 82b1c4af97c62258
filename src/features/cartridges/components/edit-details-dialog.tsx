import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { updateCartridgeInputSchema } from '@shared/schemas/cartridges';
import type { CartridgeDto } from '@shared/types/cartridges';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormField } from '@/components/ui/form-field';
import { Input, Textarea } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { FormMessage } from '@/components/ui/form-message';
import { useFormSubmit } from '@/lib/form-errors';
import { useUpdateCartridge } from '../api/update-cartridge';

/** Corrects what the delivery note said: batch, received date, notes. Serial, type and length stay. */
export function EditDetailsDialog({ cartridge, open, onClose }: { cartridge: CartridgeDto; open: boolean; onClose: () => void }) {
  const update = useUpdateCartridge();
  const toast = useToast();
  const form = useForm({
    resolver: zodResolver(updateCartridgeInputSchema),
    values: { batch: cartridge.batch, receivedAt: cartridge.receivedAt ?? '', notes: cartridge.notes ?? '' },
  });
  const { errors } = form.formState;
  const { alert, submit, close } = useFormSubmit(form, {
    fields: ['batch', 'receivedAt', 'notes'],
    onClose,
    keepValues: true,
    save: async (values, close) => {
      await update.mutateAsync({ id: cartridge.id, ...values });
      toast.success('Details saved', cartridge.serial);
      close();
    },
  });
  return (
    <Dialog
      open={open}
      onClose={close}
      title={`Details of ${cartridge.serial}`}
      description="Serial, type and length stay as registered; each change is kept in the history."
      footer={
        <>
          <Button variant="secondary" size="lg" onClick={close}>
            Cancel
          </Button>
          <Button size="lg" type="submit" form="cartridge-details-form" loading={update.isPending}>
            Save details
          </Button>
        </>
      }
    >
      <form id="cartridge-details-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
        <FormMessage message={alert} />
        <FormField label="Batch" htmlFor="cartridge-batch" error={errors.batch?.message}>
          <Input id="cartridge-batch" data-autofocus {...form.register('batch')} />
        </FormField>
        <FormField label="Received" htmlFor="cartridge-received" hint="The delivery date, YYYY-MM-DD." error={errors.receivedAt?.message}>
          <Input id="cartridge-received" type="date" {...form.register('receivedAt')} />
        </FormField>
        <FormField label="Notes" htmlFor="cartridge-notes" error={errors.notes?.message}>
          <Textarea id="cartridge-notes" rows={3} {...form.register('notes')} />
        </FormField>
      </form>
    </Dialog>
  );
}
