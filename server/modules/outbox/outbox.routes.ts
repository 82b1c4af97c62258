import { Router } from 'express';
import type { OutboxMessageDto } from '../../../shared/types/api';
import type { FakeSmtp } from '../../lib/fake-services';

/**
 * Development only: the messages the local fake SMTP server received, newest first. Mounted only
 * when the fake mail server is in use, never with a real SMTP relay. Readable without signing in
 * so that a forgotten-password link can be followed on a development machine.
 */
export function outboxRoutes({ outbox }: { outbox: FakeSmtp }) {
  const router = Router();
  router.get('/', (_req, res) => {
    const items: OutboxMessageDto[] = outbox.messages
      .slice(-200)
      .reverse()
      .map((m) => ({ id: m.id, to: m.to, subject: m.subject, text: m.text, receivedAt: m.receivedAt.toISOString() }));
    res.json({ items, total: items.length });
  });
  return router;
}
