import { Router } from 'express';

/** What the client needs to know about this server's set-up (nothing secret). */
export function appInfoRoutes({ mailOutbox }: { mailOutbox: boolean }) {
  const router = Router();
  router.get('/', (_req, res) => {
    res.json({ mailOutbox });
  });
  return router;
}
