import { Router } from 'express';
import type { ModuleDeps } from '../module-deps';

export function equipmentRoutes(_deps: ModuleDeps) {
  const router = Router();
  return router;
}
