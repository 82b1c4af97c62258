import { FileText, Paperclip, Trash2 } from 'lucide-react';
import { useRef } from 'react';
import type { AttachmentOwnerKind } from '@shared/schemas/attachments';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { useToast } from '@/components/ui/toast';
import { useCan, useMe } from '@/lib/session';
import { useAttachments, useDeleteAttachment, useUploadAttachment } from './use-attachments';
import { formatDate } from '@/lib/dates';

function sizeLabel(bytes: number) {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(0)} kB`;
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

/** Files attached to one record: list, download, attach (PDF, PNG, JPEG, CSV; at most 10 MB). */
export function AttachmentPanel({ ownerKind, ownerId, title = 'Attachments' }: { ownerKind: AttachmentOwnerKind; ownerId: string; title?: string }) {
  const owner = { ownerKind, ownerId };
  const list = useAttachments(owner);
  const uploadFile = useUploadAttachment(owner);
  const remove = useDeleteAttachment(owner);
  const mayUpload = useCan('attachments:upload');
  const mayDeleteAny = useCan('records:delete');
  const me = useMe().data;
  const toast = useToast();
  const input = useRef<HTMLInputElement>(null);

  const onFile = (file: File | undefined) => {
    if (!file) return;
    uploadFile.mutate(file, {
      onSuccess: (a) => toast.success('File attached', a.fileName),
      onError: (error) => toast.error('Not attached', error.message),
      onSettled: () => {
        if (input.current) input.current.value = '';
      },
    });
  };

  return (
    <Card
      title={title}
      description="PDF, PNG, JPEG or CSV, at most 10 MB."
      actions={
        mayUpload ? (
          <>
            <input ref={input} type="file" accept=".pdf,.png,.jpg,.jpeg,.csv,application/pdf,image/png,image/jpeg,text/csv" className="sr-only" aria-label="File to attach" onChange={(e) => onFile(e.target.files?.[0])} />
            <Button variant="secondary" size="sm" icon={<Paperclip aria-hidden="true" className="size-4" />} loading={uploadFile.isPending} onClick={() => input.current?.click()}>
              Attach file
            </Button>
          </>
        ) : null
      }
    >
      {list.isPending ? (
        <LoadingState />
      ) : list.isError ? (
        <ErrorState message={list.error.message} onRetry={() => list.refetch()} />
      ) : list.data.items.length === 0 ? (
        <p className="text-sm text-ink-600">No files yet.</p>
      ) : (
        <ul className="divide-y divide-ink-100">
          {list.data.items.map((a) => (
            <li key={a.id} className="flex min-h-11 items-center gap-3 py-2">
              <FileText aria-hidden="true" className="size-4 shrink-0 text-ink-500" />
              <a href={a.downloadUrl} className="min-w-0 flex-1 truncate font-semibold text-primary-700 underline-offset-2 hover:underline" download>
                {a.fileName}
              </a>
              <span className="hidden text-sm text-ink-600 sm:inline">
                {sizeLabel(a.sizeBytes)} · {a.uploadedBy ?? 'unknown'} · {formatDate(a.createdAt)}
              </span>
              {mayDeleteAny || (mayUpload && a.uploadedById === me?.user.id) ? (
                <Button variant="ghost" size="sm" aria-label={`Delete ${a.fileName}`} icon={<Trash2 aria-hidden="true" className="size-4" />} onClick={() => remove.mutate(a.id)} />
              ) : null}
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}
