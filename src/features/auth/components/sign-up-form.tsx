import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { PASSWORD_MIN } from '@shared/schemas/common';
import { signUpInputSchema } from '@shared/schemas/auth';
import { Button } from '@/components/ui/button';
import { FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { useFormSubmit } from '@/lib/form-errors';
import { useSignUp } from '../api/sign-up';
import { FormAlert } from './form-alert';
import { MailSent } from './mail-sent';

const fields = ['name', 'email', 'password', 'wineryName'] as const;

export function SignUpForm() {
  const signUp = useSignUp();
  const [sentTo, setSentTo] = useState<string | null>(null);
  const form = useForm({
    resolver: zodResolver(signUpInputSchema),
    defaultValues: { name: '', email: '', password: '', wineryName: '' },
  });
  const { errors } = form.formState;

  const { alert, submit } = useFormSubmit(form, {
    fields,
    save: async (values) => {
      await signUp.mutateAsync(values);
      setSentTo(values.email);
    },
  });

  if (sentTo) {
    return (
      <MailSent
        headline={<>Check your mail: we sent a link to {sentTo}. Open it within 24 hours to finish creating your account.</>}
        note={<p>If this address already has an account, the mail says so instead; sign in or reset your password from there.</p>}
        outboxNote={
          <>
            This is a development server: mail is not sent anywhere, it stays in the mail outbox. Open the outbox link printed
            in the terminal where Porewise was started (<code>npm start</code>), next to the address of the app.
          </>
        }
      />
    );
  }

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      <FormAlert message={alert} />
      <FormField label="Your name" htmlFor="sign-up-name" error={errors.name?.message}>
        <Input id="sign-up-name" autoComplete="name" {...form.register('name')} />
      </FormField>
      <FormField label="E-mail" htmlFor="sign-up-email" error={errors.email?.message}>
        <Input id="sign-up-email" type="email" autoComplete="email" inputMode="email" {...form.register('email')} />
      </FormField>
      <FormField label="Password" htmlFor="sign-up-password" hint={`At least ${PASSWORD_MIN} characters.`} error={errors.password?.message}>
        <Input id="sign-up-password" type="password" autoComplete="new-password" {...form.register('password')} />
      </FormField>
      <FormField label="Winery name" htmlFor="sign-up-winery" hint="You become this winery's owner and can invite your team." error={errors.wineryName?.message}>
        <Input id="sign-up-winery" autoComplete="organization" {...form.register('wineryName')} />
      </FormField>
      <Button type="submit" size="lg" loading={signUp.isPending} className="mt-2 w-full">
        Create account
      </Button>
    </form>
  );
}
