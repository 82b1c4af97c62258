import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { roleDescriptions, roleLabels, roles } from '@shared/permissions';
import { createInvitationInputSchema, INVITATION_DAYS } from '@shared/schemas/team';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { Select } from '@/components/ui/select';
import { useToast } from '@/components/ui/toast';
import { FormMessage } from '@/components/ui/form-message';
import { useFormSubmit } from '@/lib/form-errors';
import { useCreateInvitation } from '../api/create-invitation';

export function InviteDialog({ open, onClose }: { open: boolean; onClose: () => void }) {
  const create = useCreateInvitation();
  const toast = useToast();
  const form = useForm({ resolver: zodResolver(createInvitationInputSchema), defaultValues: { email: '', role: 'technician' as const } });
  const role = form.watch('role');
  const { errors } = form.formState;

  const { alert, submit, close } = useFormSubmit(form, {
    fields: ['email', 'role'],
    onClose,
    save: async (values, close) => {
      await create.mutateAsync(values);
      toast.success('Invitation sent', `${values.email} can join for the next ${INVITATION_DAYS} days.`);
      close();
    },
  });

  return (
    <Dialog
      open={open}
      onClose={close}
      title="Invite someone"
      description={`They get an e-mail with a link that works for ${INVITATION_DAYS} days.`}
      footer={
        <>
          <Button variant="secondary" onClick={close}>
            Cancel
          </Button>
          <Button type="submit" form="invite-form" loading={create.isPending}>
            Send invitation
          </Button>
        </>
      }
    >
      <form id="invite-form" onSubmit={submit} noValidate className="flex flex-col gap-4">
        <FormMessage message={alert} />
        <FormField label="E-mail" htmlFor="invite-email" error={errors.email?.message}>
          <Input id="invite-email" type="email" inputMode="email" autoComplete="off" data-autofocus {...form.register('email')} />
        </FormField>
        <FormField label="Role" htmlFor="invite-role" hint={roleDescriptions[role]} error={errors.role?.message}>
          <Select id="invite-role" options={roles.map((r) => ({ value: r, label: roleLabels[r] }))} {...form.register('role')} />
        </FormField>
      </form>
    </Dialog>
  );
}
