import { Router } from 'express';
import type { ModuleDeps } from '../module-deps';

export function cellarRoutes(_deps: ModuleDeps) {
  const router = Router();
  return router;
}
