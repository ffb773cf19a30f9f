/**
 * Serves the built web client (packages/web/dist) at `/`: hashed assets with
 * a long cache, index.html for every other non-API GET (client-side routes).
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import type { ConfigService } from '@nestjs/config';
import type { NestExpressApplication } from '@nestjs/platform-express';
import express, { type NextFunction, type Request, type Response } from 'express';
import { findRepoRoot } from '../config/load-config.js';

export function webDistDir(): string {
  return join(findRepoRoot(), 'packages', 'web', 'dist');
}

export function serveWeb(app: NestExpressApplication, _config: ConfigService): void {
  const dist = webDistDir();
  const index = join(dist, 'index.html');
  app.use(
    '/assets',
    express.static(join(dist, 'assets'), { immutable: true, maxAge: '365d', fallthrough: false }),
  );
  // Never for the API's paths: a file lookup on disk for every API request would be wasted.
  const files = express.static(dist, { index: false, maxAge: '1h' });
  const isApi = (req: Request) => req.path === '/api' || req.path.startsWith('/api/');
  app.use((req: Request, res: Response, next: NextFunction) =>
    isApi(req) ? next() : files(req, res, next),
  );
  app.use((req: Request, res: Response, next: NextFunction) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') return next();
    if (isApi(req)) return next();
    if (!existsSync(index)) {
      res
        .status(503)
        .type('text/plain')
        .send(
          'The Cairn web client has not been built yet. Run `npm start` (it builds it) or `npm run build -w @cairn/web`.',
        );
      return;
    }
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(index);
  });
}
