import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { passwordSchema, PASSWORD_MIN } from '@shared/schemas/common';
import { Button } from '@/components/ui/button';
import { FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { useFormSubmit } from '@/lib/form-errors';
import { useConfirmPasswordReset } from '../api/confirm-password-reset';
import { FormAlert } from './form-alert';

const newPasswordFormSchema = z
  .object({ password: passwordSchema, repeat: z.string() })
  .refine((v) => v.password === v.repeat, { path: ['repeat'], error: 'The two passwords differ.' });

export function ResetPasswordForm({ token, onDone }: { token: string; onDone: () => void }) {
  const confirm = useConfirmPasswordReset();
  const form = useForm({ resolver: zodResolver(newPasswordFormSchema), defaultValues: { password: '', repeat: '' } });
  const { errors } = form.formState;

  const { alert, submit } = useFormSubmit(form, {
    fields: ['password'],
    save: async ({ password }) => {
      await confirm.mutateAsync({ token, password });
      onDone();
    },
  });

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      <FormAlert message={alert} />
      <FormField label="New password" htmlFor="reset-password" hint={`At least ${PASSWORD_MIN} characters.`} error={errors.password?.message}>
        <Input id="reset-password" type="password" autoComplete="new-password" {...form.register('password')} />
      </FormField>
      <FormField label="Repeat the new password" htmlFor="reset-repeat" error={errors.repeat?.message}>
        <Input id="reset-repeat" type="password" autoComplete="new-password" {...form.register('repeat')} />
      </FormField>
      <Button type="submit" size="lg" loading={confirm.isPending} className="w-full">
        Set new password and sign in
      </Button>
    </form>
  );
}
