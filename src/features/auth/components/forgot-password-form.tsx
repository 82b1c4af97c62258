import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { passwordResetRequestInputSchema } from '@shared/schemas/auth';
import { Button } from '@/components/ui/button';
import { FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { paths } from '@/config/paths';
import { useFormSubmit } from '@/lib/form-errors';
import { useRequestPasswordReset } from '../api/request-password-reset';
import { FormAlert } from './form-alert';
import { MailSent } from './mail-sent';

export function ForgotPasswordForm() {
  const request = useRequestPasswordReset();
  const [sentTo, setSentTo] = useState<string | null>(null);
  const form = useForm({ resolver: zodResolver(passwordResetRequestInputSchema), defaultValues: { email: '' } });

  const { alert, submit } = useFormSubmit(form, {
    fields: ['email'],
    save: async (values) => {
      await request.mutateAsync(values);
      setSentTo(values.email);
    },
  });

  if (sentTo) {
    return (
      <MailSent
        headline={<>If an account exists for {sentTo}, a reset link is on its way. It works once, for one hour.</>}
        outboxNote={
          <>
            This is a development server: mail is not sent anywhere, it stays in the mail outbox. Open the outbox
            link printed in the terminal where Porewise was started (<code>npm start</code>), next to the address of
            the app; an owner who is signed in finds it under Mail outbox.
          </>
        }
        after={
          <Link to={paths.signIn} className="text-primary-700 underline">
            Back to sign-in
          </Link>
        }
      />
    );
  }

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      <FormAlert message={alert} />
      <FormField label="E-mail" htmlFor="forgot-email" error={form.formState.errors.email?.message}>
        <Input id="forgot-email" type="email" autoComplete="email" inputMode="email" {...form.register('email')} />
      </FormField>
      <Button type="submit" size="lg" loading={request.isPending} className="w-full">
        Send reset link
      </Button>
    </form>
  );
}
