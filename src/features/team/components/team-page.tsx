import type { ColumnDef } from '@tanstack/react-table';
import { UserPlus } from 'lucide-react';
import { useMemo, useState } from 'react';
import { roleDescriptions, roleLabels, roles, type Role } from '@shared/permissions';
import type { InvitationDto, MeDto, MemberDto } from '@shared/types/api';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { DataTable } from '@/components/ui/data-table';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { PageHeader } from '@/components/ui/page-header';
import { Select } from '@/components/ui/select';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { useCan } from '@/lib/session';
import { useChangeRole } from '../api/change-role';
import { useTeam } from '../api/get-team';
import { useRemoveMember } from '../api/remove-member';
import { useRevokeInvitation } from '../api/revoke-invitation';
import { InviteDialog } from './invite-dialog';
import { formatDate, formatAgo } from '@/lib/dates';


export function TeamPage({ me }: { me: MeDto }) {
  const team = useTeam();
  const mayInvite = useCan('team:invite');
  const mayChangeRoles = useCan('team:change-role');
  const mayRemove = useCan('team:remove');
  const changeRole = useChangeRole();
  const removeMember = useRemoveMember();
  const revoke = useRevokeInvitation();
  const toast = useToast();
  const [inviting, setInviting] = useState(false);
  const [removing, setRemoving] = useState<MemberDto | null>(null);

  const memberColumns = useMemo<ColumnDef<MemberDto>[]>(
    () => [
      {
        header: 'Name',
        accessorKey: 'name',
        cell: ({ row }) => (
          <div className="min-w-40">
            <div className="font-semibold text-ink-900">
              {row.original.name}
              {row.original.userId === me.user.id ? <span className="ml-2 text-sm font-normal text-ink-500">(you)</span> : null}
            </div>
            <div className="text-sm text-ink-600">{row.original.email}</div>
          </div>
        ),
      },
      {
        header: 'Role',
        accessorKey: 'role',
        cell: ({ row }) =>
          mayChangeRoles ? (
            <Select
              aria-label={`Role of ${row.original.name}`}
              value={row.original.role}
              disabled={changeRole.isPending}
              onChange={(e) => {
                // Read the choice now: by the time the answer comes the select shows the stored role again.
                const role = e.target.value as Role;
                changeRole.mutate(
                  { userId: row.original.userId, role },
                  {
                    onSuccess: () => toast.success('Role changed', `${row.original.name} is now ${roleLabels[role].toLowerCase()}.`),
                    onError: (error) => toast.error('Role not changed', errorMessage(error)),
                  },
                );
              }}
              options={roles.map((r) => ({ value: r, label: roleLabels[r] }))}
              wrapperClassName="min-w-40"
            />
          ) : (
            roleLabels[row.original.role]
          ),
      },
      { header: 'Joined', accessorKey: 'joinedAt', cell: ({ getValue }) => <span className="num whitespace-nowrap">{formatDate(getValue<string>())}</span> },
      ...(mayRemove
        ? [
            {
              id: 'actions',
              header: () => <span className="sr-only">Actions</span>,
              cell: ({ row }: { row: { original: MemberDto } }) => (
                <Button variant="ghost" size="sm" onClick={() => setRemoving(row.original)}>
                  Remove
                </Button>
              ),
            } satisfies ColumnDef<MemberDto>,
          ]
        : []),
    ],
    [me.user.id, mayChangeRoles, mayRemove, changeRole, toast],
  );

  const invitationColumns = useMemo<ColumnDef<InvitationDto>[]>(
    () => [
      { header: 'E-mail', accessorKey: 'email' },
      { header: 'Role', accessorKey: 'role', cell: ({ getValue }) => roleLabels[getValue<Role>()] },
      { header: 'Invited by', accessorKey: 'invitedBy', cell: ({ getValue }) => getValue<string | null>() ?? '—' },
      {
        header: 'Link expires',
        accessorKey: 'expiresAt',
        cell: ({ getValue }) => <span className="whitespace-nowrap">{formatAgo(getValue<string>())}</span>,
      },
      {
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        cell: ({ row }) => (
          <Button
            variant="ghost"
            size="sm"
            onClick={() =>
              revoke.mutate(row.original.id, {
                onSuccess: () => toast.info('Invitation withdrawn', `The link sent to ${row.original.email} no longer works.`),
                onError: (error) => toast.error('Not withdrawn', errorMessage(error)),
              })
            }
          >
            Withdraw
          </Button>
        ),
      },
    ],
    [revoke, toast],
  );

  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Team"
        description="Who works in this winery's cellar records, and what each role may do."
        actions={
          mayInvite ? (
            <Button icon={<UserPlus aria-hidden="true" className="size-4" />} onClick={() => setInviting(true)}>
              Invite someone
            </Button>
          ) : null
        }
      />
      {team.isPending ? (
        <LoadingState />
      ) : team.isError ? (
        <ErrorState message={errorMessage(team.error)} onRetry={() => team.refetch()} />
      ) : (
        <>
          <Card title="Members" flush>
            <DataTable columns={memberColumns} data={team.data.members} getRowId={(m) => m.userId} caption="Members of this winery" />
          </Card>
          {mayInvite && team.data.invitations.length > 0 ? (
            <Card title="Waiting to join" flush>
              <DataTable columns={invitationColumns} data={team.data.invitations} getRowId={(i) => i.id} caption="Pending invitations" />
            </Card>
          ) : null}
        </>
      )}
      <Card title="Roles">
        <dl className="grid gap-3 sm:grid-cols-2">
          {roles.map((r) => (
            <div key={r}>
              <dt className="font-semibold text-ink-900">{roleLabels[r]}</dt>
              <dd className="text-sm text-ink-600">{roleDescriptions[r]}</dd>
            </div>
          ))}
        </dl>
      </Card>
      <InviteDialog open={inviting} onClose={() => setInviting(false)} />
      <ConfirmDialog
        open={removing !== null}
        onClose={() => setRemoving(null)}
        title={`Remove ${removing?.name ?? ''}?`}
        description="They lose access to this winery at once. Their past records stay, with their name."
        cancelLabel="Keep"
        confirmLabel="Remove from winery"
        pending={removeMember.isPending}
        onConfirm={() =>
          removing &&
          removeMember.mutate(removing.userId, {
            onSuccess: () => {
              toast.success('Removed', `${removing.name} is no longer a member.`);
              setRemoving(null);
            },
            onError: (error) => {
              toast.error('Not removed', errorMessage(error));
              setRemoving(null);
            },
          })
        }
      />
    </div>
  );
}
