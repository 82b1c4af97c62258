import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { z } from 'zod';
import { roleDescriptions, roleLabels } from '@shared/permissions';
import { passwordSchema, personNameSchema, PASSWORD_MIN } from '@shared/schemas/common';
import type { MeDto } from '@shared/types/api';
import { Button } from '@/components/ui/button';
import { FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { paths, withNext } from '@/config/paths';
import { applyServerErrors } from '@/lib/form-errors';
import { useAcceptInvitation } from '../api/accept-invitation';
import { usePreviewInvitation } from '../api/preview-invitation';
import { FormAlert } from './form-alert';

const newMemberSchema = z.object({ name: personNameSchema, password: passwordSchema });

/** Shows what the invitation is for and lets the invitee join: new account, or the signed-in one. */
export function InvitationPanel({ token, me, onJoined }: { token: string; me: MeDto | null; onJoined: () => void }) {
  const preview = usePreviewInvitation(token);
  const accept = useAcceptInvitation();
  const [alert, setAlert] = useState<string | null>(null);
  const form = useForm({ resolver: zodResolver(newMemberSchema), defaultValues: { name: '', password: '' } });

  if (!token) return <ErrorState title="This link is incomplete" message="Open the link from the invitation e-mail again, or ask for a new invitation." />;
  if (preview.isPending) return <LoadingState />;
  if (preview.isError) return <ErrorState title="This invitation cannot be used" message={preview.error.message} />;

  const inv = preview.data;
  const here = `${paths.invitation}?token=${encodeURIComponent(token)}`;
  const summary = (
    <div className="rounded-md border border-ink-200 bg-ink-50 p-4">
      <p className="text-base text-ink-900">
        Join <strong>{inv.wineryName}</strong> as <strong>{roleLabels[inv.role].toLowerCase()}</strong>.
      </p>
      <p className="mt-1 text-sm text-ink-600">{roleDescriptions[inv.role]}</p>
      <p className="mt-2 text-sm text-ink-600">Invitation for {inv.email}</p>
    </div>
  );

  const join = async (body: { name?: string; password?: string }) => {
    setAlert(null);
    try {
      await accept.mutateAsync({ token, ...body });
      onJoined();
    } catch (error) {
      setAlert(applyServerErrors(error, form.setError, ['name', 'password']));
    }
  };

  if (me) {
    const sameEmail = me.user.email === inv.email;
    return (
      <div className="flex flex-col gap-4">
        {summary}
        <FormAlert message={alert} />
        {sameEmail ? (
          <Button size="lg" loading={accept.isPending} onClick={() => join({})}>
            Join {inv.wineryName}
          </Button>
        ) : (
          <p className="text-sm text-ink-700">
            You are signed in as {me.user.email}. This invitation is for {inv.email}: sign out and open the link again.
          </p>
        )}
      </div>
    );
  }

  if (inv.accountExists) {
    return (
      <div className="flex flex-col gap-4">
        {summary}
        <p className="text-sm text-ink-700">You already have a Porewise account. Sign in and you will join straight away.</p>
        <Link to={withNext(paths.signIn, here)} className="inline-flex min-h-11 items-center justify-center rounded-md bg-primary-600 px-4 font-semibold text-white hover:bg-primary-700">
          Sign in to accept
        </Link>
      </div>
    );
  }

  const { errors } = form.formState;
  return (
    <form onSubmit={form.handleSubmit((v) => join(v))} noValidate className="flex flex-col gap-4">
      {summary}
      <FormAlert message={alert} />
      <FormField label="Your name" htmlFor="invite-name" error={errors.name?.message}>
        <Input id="invite-name" autoComplete="name" {...form.register('name')} />
      </FormField>
      <FormField label="Choose a password" htmlFor="invite-password" hint={`At least ${PASSWORD_MIN} characters.`} error={errors.password?.message}>
        <Input id="invite-password" type="password" autoComplete="new-password" {...form.register('password')} />
      </FormField>
      <Button type="submit" size="lg" loading={accept.isPending} className="w-full">
        Create account and join
      </Button>
    </form>
  );
}
