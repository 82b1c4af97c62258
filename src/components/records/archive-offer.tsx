import { useMutation, useQueryClient } from '@tanstack/react-query';
import { Archive, ArchiveRestore } from 'lucide-react';
import { Button } from '@/components/ui/button';
import { useToast } from '@/components/ui/toast';
import { api, ApiError, errorMessage } from '@/lib/api-client';

export type ArchivableKind = 'lots' | 'plans' | 'cartridges' | 'housings' | 'cartridge-types';

/** Archives or unarchives a row: hidden from lists by default, still in every record. */
export const setArchived = ({ kind, id, archived }: { kind: ArchivableKind; id: string; archived: boolean }) =>
  api.post<{ id: string; archived: boolean; archivedAt: string | null }>(`/${kind}/${encodeURIComponent(id)}/${archived ? 'archive' : 'unarchive'}`);

export function useSetArchived() {
  const qc = useQueryClient();
  // Lists of several features show the row: refresh whatever is cached.
  return useMutation({ mutationFn: setArchived, onSuccess: () => qc.invalidateQueries() });
}

/** True when a delete was refused because a record holds the row (409 in_record). */
export const isInRecord = (error: unknown) => error instanceof ApiError && error.code === 'in_record';

/** Shown when a delete is refused because the row is in a record: offers to archive instead. */
export function ArchiveOffer({ kind, id, name, onDone }: { kind: ArchivableKind; id: string; name: string; onDone: () => void }) {
  const archive = useSetArchived();
  const toast = useToast();
  return (
    <Button
      variant="secondary"
      icon={<Archive aria-hidden="true" />}
      loading={archive.isPending}
      onClick={() =>
        archive.mutate(
          { kind, id, archived: true },
          {
            onSuccess: () => {
              toast.success('Archived', `${name} is hidden from lists and stays in every record.`);
              onDone();
            },
            onError: (e) => toast.error('Not archived', errorMessage(e)),
          },
        )
      }
    >
      Archive instead
    </Button>
  );
}

/** "Show archived" for a list: archived rows are hidden unless it is ticked. */
export function ShowArchivedToggle({ id, checked, onChange }: { id: string; checked: boolean; onChange: (v: boolean) => void }) {
  return (
    <label htmlFor={id} className="flex min-h-11 items-center gap-2 text-sm font-semibold text-ink-800">
      <input id={id} type="checkbox" className="size-5" checked={checked} onChange={(e) => onChange(e.target.checked)} />
      Show archived
    </label>
  );
}

/** Archive a row, or restore an archived one to the lists; it stays in every record either way. */
export function ArchiveToggleButton({ kind, id, name, archivedAt }: { kind: ArchivableKind; id: string; name: string; archivedAt: string | null }) {
  const archive = useSetArchived();
  const toast = useToast();
  const archived = archivedAt !== null;
  return (
    <Button
      variant="secondary"
      icon={archived ? <ArchiveRestore aria-hidden="true" className="size-4" /> : <Archive aria-hidden="true" className="size-4" />}
      loading={archive.isPending}
      onClick={() =>
        archive.mutate(
          { kind, id, archived: !archived },
          {
            onSuccess: () => toast.success(archived ? 'Restored' : 'Archived', archived ? `${name} is back in the lists.` : `${name} is hidden from lists and stays in every record.`),
            onError: (e) => toast.error(archived ? 'Not restored' : 'Not archived', errorMessage(e)),
          },
        )
      }
    >
      {archived ? 'Restore from archive' : 'Archive'}
    </Button>
  );
}
