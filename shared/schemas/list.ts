import { z } from 'zod';

export const PAGE_SIZE_DEFAULT = 25;
export const PAGE_SIZE_MAX = 100;
export const SEARCH_MAX = 100;

/** `?page=&pageSize=` of every paged list: page from 1, at most PAGE_SIZE_MAX per page. */
export function pageFields(defaultPageSize: number) {
  return {
    page: z.coerce.number({ error: 'Page is a number.' }).int().min(1, { error: 'Pages start at 1.' }).default(1),
    pageSize: z.coerce
      .number({ error: 'Page size is a number.' })
      .int()
      .min(1)
      .max(PAGE_SIZE_MAX, { error: `At most ${PAGE_SIZE_MAX} per page.` })
      .default(defaultPageSize),
  };
}

/**
 * `?q=&sort=&order=&page=&pageSize=` for list endpoints. `sortable` names the columns a list
 * may sort by; anything else is a 400 with a field message.
 */
export function listQuerySchema<const S extends readonly [string, ...string[]]>(sortable: S, defaultSort: S[number]) {
  return z.object({
    q: z.string().trim().max(SEARCH_MAX, { error: `Search text is at most ${SEARCH_MAX} characters.` }).optional().transform((v) => (v ? v : undefined)),
    sort: z.enum(sortable, { error: `Sort by one of: ${sortable.join(', ')}.` }).default(defaultSort),
    order: z.enum(['asc', 'desc'], { error: 'Order is asc or desc.' }).default('asc'),
    ...pageFields(PAGE_SIZE_DEFAULT),
    /** `true` lists archived rows too (each marked `archived`); they are hidden by default. */
    archived: z.enum(['true', 'false'], { error: 'archived is true or false.' }).optional(),
  });
}

export type ListQuery<S extends string = string> = { q?: string; sort: S; order: 'asc' | 'desc'; page: number; pageSize: number; archived?: 'true' | 'false' };

/** True when a list query asks for archived rows too. */
export const withArchived = (query: { archived?: 'true' | 'false' }) => query.archived === 'true';
