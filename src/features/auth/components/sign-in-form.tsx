import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { signInInputSchema } from '@shared/schemas/auth';
import { Button } from '@/components/ui/button';
import { FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { paths } from '@/config/paths';
import { useFormSubmit } from '@/lib/form-errors';
import { useSignIn } from '../api/sign-in';
import { FormAlert } from './form-alert';

export function SignInForm({ onSignedIn, defaultEmail = '' }: { onSignedIn: () => void; defaultEmail?: string }) {
  const signIn = useSignIn();
  const form = useForm({ resolver: zodResolver(signInInputSchema), defaultValues: { email: defaultEmail, password: '' } });
  const { errors } = form.formState;

  const { alert, submit } = useFormSubmit(form, {
    fields: ['email', 'password'],
    save: async (values) => {
      await signIn.mutateAsync(values);
      onSignedIn();
    },
  });

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      <FormAlert message={alert} />
      <FormField label="E-mail" htmlFor="sign-in-email" error={errors.email?.message}>
        <Input id="sign-in-email" type="email" autoComplete="email" inputMode="email" {...form.register('email')} />
      </FormField>
      <FormField label="Password" htmlFor="sign-in-password" error={errors.password?.message}>
        <Input id="sign-in-password" type="password" autoComplete="current-password" {...form.register('password')} />
      </FormField>
      <div className="flex items-center justify-between gap-4">
        <Link to={paths.forgotPassword} className="text-sm text-primary-700 underline-offset-2 hover:underline">
          Forgot your password?
        </Link>
        <Button type="submit" size="lg" loading={signIn.isPending}>
          Sign in
        </Button>
      </div>
    </form>
  );
}
