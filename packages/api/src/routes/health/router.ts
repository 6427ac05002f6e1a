import { Router } from 'express';
import { version } from '../../config.js';
import type { Health } from '../../contract/health.js';
import { pingDatabase } from '../../db/connection.js';

/** `GET /api/health`: ok only after a real query; 503 with db "down" otherwise. */
export const healthRouter = Router();

healthRouter.get('/', async (_req, res) => {
  const up = await pingDatabase();
  const body: Health = { status: up ? 'ok' : 'degraded', db: up ? 'up' : 'down', version };
  res.status(up ? 200 : 503).json(body);
});
