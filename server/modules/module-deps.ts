import type { Database } from '../db/client';
import type { Mailer } from '../lib/mail';
import type { Storage } from '../lib/storage';

/** What a domain module's router receives from createApp. */
export type ModuleDeps = { db: Database; storage: Storage; mailer: Mailer; appUrl: string };
