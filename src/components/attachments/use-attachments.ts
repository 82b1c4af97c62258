// Attachments are shared by several features (lots, lab results, cartridge types…), so their
// hooks live beside the shared panel rather than in one feature.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { AttachmentOwner } from '@shared/schemas/attachments';
import type { AttachmentDto } from '@shared/types/api';
import { api, ApiError } from '@/lib/api-client';
import { queryRoots } from '@/lib/query-keys';

export const attachmentKeys = {
  all: queryRoots.attachments,
  list: (owner: AttachmentOwner) => [...attachmentKeys.all, 'list', owner.ownerKind, owner.ownerId] as const,
};

export const getAttachments = (owner: AttachmentOwner) =>
  api.get<{ items: AttachmentDto[] }>(`/attachments?ownerKind=${encodeURIComponent(owner.ownerKind)}&ownerId=${encodeURIComponent(owner.ownerId)}`);

export const getAttachmentsQueryOptions = (owner: AttachmentOwner) => queryOptions({ queryKey: attachmentKeys.list(owner), queryFn: () => getAttachments(owner) });

export function useAttachments(owner: AttachmentOwner) {
  return useQuery(getAttachmentsQueryOptions(owner));
}

/** Multipart upload (the one request that is not JSON). */
export async function uploadAttachment(owner: AttachmentOwner, file: File): Promise<AttachmentDto> {
  const form = new FormData();
  form.set('ownerKind', owner.ownerKind);
  form.set('ownerId', owner.ownerId);
  form.set('file', file);
  const res = await fetch('/api/attachments', { method: 'POST', body: form, credentials: 'same-origin' });
  const data = await res.json().catch(() => null);
  if (!res.ok) throw new ApiError(res.status, data?.error?.code ?? 'http_error', data?.error?.fields?.file ?? data?.error?.message ?? 'Upload failed.', data?.error?.fields);
  return data as AttachmentDto;
}

export function useUploadAttachment(owner: AttachmentOwner) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (file: File) => uploadAttachment(owner, file), onSuccess: () => qc.invalidateQueries({ queryKey: attachmentKeys.list(owner) }) });
}

export function useDeleteAttachment(owner: AttachmentOwner) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.delete<void>(`/attachments/${encodeURIComponent(id)}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: attachmentKeys.list(owner) }),
  });
}
