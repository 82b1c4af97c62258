import { Router } from 'express';
import { requireSignedIn } from '../../middleware/authenticate';

/** The engine over HTTP (filled in by the calculation API). */
export function calcRoutes() {
  const router = Router();
  router.use(requireSignedIn);
  return router;
}
