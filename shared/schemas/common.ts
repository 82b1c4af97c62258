import { z } from 'zod';

export const NAME_MAX = 120;
export const EMAIL_MAX = 254;
export const PASSWORD_MIN = 10;
export const PASSWORD_MAX = 256;
export const WINERY_NAME_MAX = 120;
export const TOKEN_MAX = 200;

export const emailSchema = z
  .string({ error: 'Enter an e-mail address.' })
  .trim()
  .toLowerCase()
  .max(EMAIL_MAX, { error: `E-mail addresses are at most ${EMAIL_MAX} characters.` })
  .pipe(z.email({ error: 'Enter a valid e-mail address, such as name@winery.com.' }));

export const passwordSchema = z
  .string({ error: 'Enter a password.' })
  .min(PASSWORD_MIN, { error: `Use at least ${PASSWORD_MIN} characters.` })
  .max(PASSWORD_MAX, { error: `Use at most ${PASSWORD_MAX} characters.` });

export const personNameSchema = z
  .string({ error: 'Enter your name.' })
  .trim()
  .min(1, { error: 'Enter your name.' })
  .max(NAME_MAX, { error: `Names are at most ${NAME_MAX} characters.` });

export const tokenSchema = z.string({ error: 'The link is missing its token.' }).min(10).max(TOKEN_MAX);

export const uuidSchema = z.uuid({ error: 'Not a valid id.' });

export const unitSystems = ['metric', 'us'] as const;
export const unitSystemSchema = z.enum(unitSystems, { error: 'Choose metric or US customary units.' });
export type UnitSystem = z.infer<typeof unitSystemSchema>;
