import { randomUUID } from 'node:crypto';
import type { AttachmentOwner } from '../../../shared/schemas/attachments';
import type { AttachmentDto } from '../../../shared/types/api';
import type { Database, DbOrTx } from '../../db/client';
import { can } from '../../../shared/permissions';
import { badRequest, forbidden, notFound } from '../../lib/errors';
import type { Storage } from '../../lib/storage';
import type { TenantContext } from '../../middleware/authorize';
import { createAttachmentsRepository, type AttachmentRow } from './attachments.repository';

/** Records a file already put in storage as an attachment, inside the caller's transaction (a logger file kept with its run). */
export function insertAttachmentIn(tx: DbOrTx, values: Parameters<ReturnType<typeof createAttachmentsRepository>['insert']>[0]) {
  return createAttachmentsRepository(tx).insert(values);
}
import { safeFileName, sniffFileType } from './file-type';
import { audited } from '../audit/audit.service';

export function presentAttachment(row: AttachmentRow): AttachmentDto {
  return {
    id: row.id,
    ownerKind: row.ownerKind,
    ownerId: row.ownerId,
    fileName: row.fileName,
    contentType: row.contentType,
    sizeBytes: row.sizeBytes,
    uploadedBy: row.uploadedBy,
    uploadedById: row.uploadedById,
    createdAt: row.createdAt.toISOString(),
    downloadUrl: `/api/attachments/${row.id}/download`,
  };
}

/** Files attached to records: bytes in object storage, metadata in PostgreSQL, access through the winery. */
export function createAttachmentsService({ db, storage }: { db: Database; storage: Storage }) {
  const repo = createAttachmentsRepository(db);
  return {
    async list(tenant: TenantContext, owner: AttachmentOwner) {
      if (!(await repo.ownerExists(tenant.wineryId, owner))) throw notFound('Record');
      return (await repo.list(tenant.wineryId, owner)).map(presentAttachment);
    },

    async upload(tenant: TenantContext, owner: AttachmentOwner, file: { originalName: string; buffer: Uint8Array }) {
      if (!(await repo.ownerExists(tenant.wineryId, owner))) throw notFound('Record');
      const sniffed = sniffFileType(file.buffer);
      const fileName = safeFileName(file.originalName);
      const extension = fileName.includes('.') ? fileName.split('.').pop()!.toLowerCase() : '';
      if (!sniffed) throw badRequest('Only PDF, PNG, JPEG and CSV files can be attached.', { file: 'This file is not a PDF, PNG, JPEG or CSV.' });
      if (!sniffed.extensions.includes(extension)) {
        throw badRequest('The file name does not match its content.', {
          file: `The content is ${sniffed.kind.toUpperCase()}, but the name ends in “.${extension || '(none)'}”. Rename it to .${sniffed.extensions[0]}.`,
        });
      }
      const storageKey = `wineries/${tenant.wineryId}/attachments/${randomUUID()}`;
      await storage.put(storageKey, file.buffer, sniffed.contentType);
      try {
        const id = await audited(db, tenant, { action: 'create', kind: 'attachment' }, (tx) => createAttachmentsRepository(tx).insert({
          wineryId: tenant.wineryId,
          ownerKind: owner.ownerKind,
          ownerId: owner.ownerId,
          fileName,
          contentType: sniffed.contentType,
          sizeBytes: file.buffer.byteLength,
          storageKey,
          uploadedBy: tenant.userId,
        }));
        return presentAttachment((await repo.find(tenant.wineryId, id))!);
      } catch (error) {
        await storage.remove(storageKey).catch(() => undefined);
        throw error;
      }
    },

    async download(tenant: TenantContext, id: string) {
      const row = await repo.find(tenant.wineryId, id);
      if (!row) throw notFound('Attachment');
      const object = await storage.get(row.storageKey);
      return { row, body: object.body };
    },

    async remove(tenant: TenantContext, id: string) {
      const row = await repo.find(tenant.wineryId, id);
      if (!row) throw notFound('Attachment');
      // Files are part of the record: the owner may remove any, others only what they attached themselves.
      if (!can(tenant.role, 'records:delete') && row.uploadedById !== tenant.userId) {
        throw forbidden('Only the person who attached this file, or the owner, can delete it.');
      }
      await audited(db, tenant, { action: 'delete', kind: 'attachment', id }, (tx) => createAttachmentsRepository(tx).remove(tenant.wineryId, id));
      await storage.remove(row.storageKey).catch(() => undefined);
    },
  };
}
