import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { PASSWORD_MIN } from '@shared/schemas/common';
import { signUpInputSchema } from '@shared/schemas/auth';
import { Button } from '@/components/ui/button';
import { FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { applyServerErrors } from '@/lib/form-errors';
import { useSignUp } from '../api/sign-up';
import { FormAlert } from './form-alert';

const fields = ['name', 'email', 'password', 'wineryName'] as const;

export function SignUpForm({ onSignedUp }: { onSignedUp: () => void }) {
  const signUp = useSignUp();
  const [alert, setAlert] = useState<string | null>(null);
  const form = useForm({
    resolver: zodResolver(signUpInputSchema),
    defaultValues: { name: '', email: '', password: '', wineryName: '' },
  });
  const { errors } = form.formState;

  const submit = form.handleSubmit(async (values) => {
    setAlert(null);
    try {
      await signUp.mutateAsync(values);
      onSignedUp();
    } catch (error) {
      setAlert(applyServerErrors(error, form.setError, fields));
    }
  });

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
