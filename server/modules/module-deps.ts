import type { Database } from '../db/client';
import type { Mailer } from '../lib/mail';
import type { Storage } from '../lib/storage';
import type { AnswerCache } from '../middleware/answer-cache';

/** What a domain module's router receives from createApp. */
export type ModuleDeps = {
  db: Database;
  storage: Storage;
  mailer: Mailer;
  appUrl: string;
  /** Kept read answers: `answers.reuse` on a GET worked out only from the winery's data, the person and the clock. */
  answers: AnswerCache;
};
