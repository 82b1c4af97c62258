import { z } from 'zod';
import { roles } from '../permissions';
import { emailSchema, passwordSchema, personNameSchema, tokenSchema } from './common';

export const roleSchema = z.enum(roles, { error: 'Choose a role.' });

export const INVITATION_DAYS = 7;

export const createInvitationInputSchema = z.object({ email: emailSchema, role: roleSchema });
export type CreateInvitationInput = z.infer<typeof createInvitationInputSchema>;

export const changeRoleInputSchema = z.object({ role: roleSchema });
export type ChangeRoleInput = z.infer<typeof changeRoleInputSchema>;

export const invitationTokenInputSchema = z.object({ token: tokenSchema });

export const acceptInvitationInputSchema = z.object({
  token: tokenSchema,
  name: personNameSchema.optional(),
  password: passwordSchema.optional(),
});
export type AcceptInvitationInput = z.infer<typeof acceptInvitationInputSchema>;
