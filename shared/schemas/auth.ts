import { z } from 'zod';
import {
  emailSchema,
  passwordSchema,
  personNameSchema,
  tokenSchema,
  unitSystemSchema,
  uuidSchema,
  WINERY_NAME_MAX,
} from './common';

export const signUpInputSchema = z.object({
  name: personNameSchema,
  email: emailSchema,
  password: passwordSchema,
  wineryName: z
    .string({ error: 'Enter the winery name.' })
    .trim()
    .min(1, { error: 'Enter the winery name.' })
    .max(WINERY_NAME_MAX, { error: `Winery names are at most ${WINERY_NAME_MAX} characters.` }),
});
export type SignUpInput = z.infer<typeof signUpInputSchema>;

export const signUpConfirmInputSchema = z.object({ token: tokenSchema });
export type SignUpConfirmInput = z.infer<typeof signUpConfirmInputSchema>;

export const signInInputSchema = z.object({
  email: emailSchema,
  password: z.string({ error: 'Enter your password.' }).min(1, { error: 'Enter your password.' }).max(256),
});
export type SignInInput = z.infer<typeof signInInputSchema>;

export const passwordResetRequestInputSchema = z.object({ email: emailSchema });
export type PasswordResetRequestInput = z.infer<typeof passwordResetRequestInputSchema>;

export const passwordResetConfirmInputSchema = z.object({ token: tokenSchema, password: passwordSchema });
export type PasswordResetConfirmInput = z.infer<typeof passwordResetConfirmInputSchema>;

export const updateMeInputSchema = z
  .object({ name: personNameSchema.optional(), units: unitSystemSchema.optional() })
  .refine((v) => v.name !== undefined || v.units !== undefined, { error: 'Nothing to change.' });
export type UpdateMeInput = z.infer<typeof updateMeInputSchema>;

export const setActiveWineryInputSchema = z.object({ wineryId: uuidSchema });
export type SetActiveWineryInput = z.infer<typeof setActiveWineryInputSchema>;
