/**
 * The Express application: JSON API under /api, and in production the built web app with
 * a fallback to index.html for the client-side routes.
 */
import { existsSync } from 'node:fs';
import path from 'node:path';
import express from 'express';
import type { Express } from 'express';
import { errorMiddleware, unknownRoute } from './errors.js';
import { healthRouter } from './routes/health/router.js';

export interface AppOptions {
  /** Folder of the built web app to serve, or null to serve none. */
  webDist: string | null;
}

export function createApp({ webDist }: AppOptions): Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');

  const api = express.Router();
  api.use(express.json({ limit: '256kb' }));
  api.use('/health', healthRouter);
  api.use(unknownRoute);
  app.use('/api', api);

  if (webDist && existsSync(path.join(webDist, 'index.html'))) {
    app.use(express.static(webDist, { index: false, maxAge: '1h' }));
    // Client-side routes: anything that is not an API call or a file gets the app.
    app.get(/^(?!\/api\/).*/, (_req, res) => {
      res.sendFile(path.join(webDist, 'index.html'), { maxAge: 0 });
    });
  }

  app.use(errorMiddleware);
  return app;
}
