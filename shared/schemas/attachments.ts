import { z } from 'zod';

export const ATTACHMENT_MAX_BYTES = 10 * 1024 * 1024;
export const attachmentOwnerKinds = ['lot', 'lab-result', 'cartridge-type', 'cartridge', 'housing', 'run'] as const;
export type AttachmentOwnerKind = (typeof attachmentOwnerKinds)[number];

export const attachmentOwnerSchema = z.object({
  ownerKind: z.enum(attachmentOwnerKinds, { error: 'Attach to a lot, lab result, cartridge type, cartridge, housing or run.' }),
  ownerId: z.uuid({ error: 'Not a valid record id.' }),
});
export type AttachmentOwner = z.infer<typeof attachmentOwnerSchema>;
