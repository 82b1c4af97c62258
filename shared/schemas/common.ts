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

/** Dates Porewise accepts: a plausible working range (PostgreSQL has no year 0, and typos like 0202 are caught). */
export const DATE_YEAR_MIN = 1900;
export const DATE_YEAR_MAX = 2200;
export const yearInRange = (iso: string) => {
  const year = Number(iso.slice(0, 4));
  return year >= DATE_YEAR_MIN && year <= DATE_YEAR_MAX;
};
export const yearRangeMessage = `Use a year between ${DATE_YEAR_MIN} and ${DATE_YEAR_MAX}.`;
