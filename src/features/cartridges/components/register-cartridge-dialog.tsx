import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import { CARTRIDGE_LENGTHS_IN, createCartridgeInputSchema } from '@shared/schemas/cartridges';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormField } from '@/components/ui/form-field';
import { Input, Textarea } from '@/components/ui/input';
import { Select } from '@/components/ui/select';
import { useToast } from '@/components/ui/toast';
import { FormMessage } from '@/components/ui/form-message';
import { paths } from '@/config/paths';
import { useFormSubmit } from '@/lib/form-errors';
import { useRegisterCartridge } from '../api/register-cartridge';
import { toDayInput } from '@/lib/dates';

const FIELDS = ['serial', 'batch', 'typeId', 'lengthIn', 'receivedAt', 'notes'] as const;

/** Registers one cartridge into stock. */
export function RegisterCartridgeDialog({ open, onClose, types }: { open: boolean; onClose: () => void; types: { id: string; name: string }[] }) {
  const register = useRegisterCartridge();
  const toast = useToast();
  const navigate = useNavigate();
  const form = useForm({
    resolver: zodResolver(createCartridgeInputSchema),
    defaultValues: { serial: '', batch: '', typeId: '', lengthIn: 30, receivedAt: toDayInput(), notes: '' },
  });
  const { errors } = form.formState;

  const { alert, submit, close } = useFormSubmit(form, {
    fields: FIELDS,
    onClose,
    save: async (values, close) => {
      const c = await register.mutateAsync(values);
      toast.success('Cartridge registered', `${c.serial} is in stock.`);
      close();
      navigate(paths.cartridge(c.id));
    },
  });

  return (
    <Dialog
      open={open}
      onClose={close}
      title="Register cartridge"
      description="One cartridge into stock. For a whole delivery, import its CSV list instead."
      footer={
        <>
          <Button variant="secondary" size="lg" onClick={close}>
            Cancel
          </Button>
          <Button type="submit" size="lg" form="register-cartridge-form" loading={register.isPending}>
            Register cartridge
          </Button>
        </>
      }
    >
      <form id="register-cartridge-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
        <FormMessage message={alert} />
        {types.length === 0 ? <p className="text-base text-ink-700">Add a cartridge type under Equipment first: every cartridge belongs to one.</p> : null}
        <FormField label="Serial" htmlFor="reg-serial" error={errors.serial?.message} required>
          <Input id="reg-serial" autoComplete="off" data-autofocus {...form.register('serial')} />
        </FormField>
        <FormField label="Batch" htmlFor="reg-batch" error={errors.batch?.message} hint="As printed on the box, for traceability.">
          <Input id="reg-batch" autoComplete="off" {...form.register('batch')} />
        </FormField>
        <FormField label="Type" htmlFor="reg-type" error={errors.typeId?.message} required>
          <Select id="reg-type" placeholder="Choose a type" options={types.map((t) => ({ value: t.id, label: t.name }))} {...form.register('typeId')} />
        </FormField>
        <div className="grid gap-4 sm:grid-cols-2">
          <FormField label="Length" htmlFor="reg-length" error={errors.lengthIn?.message} required>
            <Select id="reg-length" options={CARTRIDGE_LENGTHS_IN.map((l) => ({ value: String(l), label: `${l} inches` }))} {...form.register('lengthIn')} />
          </FormField>
          <FormField label="Received" htmlFor="reg-received" error={errors.receivedAt?.message}>
            <Input id="reg-received" type="date" {...form.register('receivedAt')} />
          </FormField>
        </div>
        <FormField label="Notes" htmlFor="reg-notes" error={errors.notes?.message}>
          <Textarea id="reg-notes" rows={2} {...form.register('notes')} />
        </FormField>
      </form>
    </Dialog>
  );
}
