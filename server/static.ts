/**
 * Serves the built client: hashed assets with a year's cache, everything else revalidated, and
 * `index.html` for every non-API GET so client-side routes load. Without a build, the fallback
 * says how to make one.
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import express, { type Router } from 'express';

export function clientRouter(clientDir: string | null): Router {
  const router = express.Router();
  const index = clientDir ? join(clientDir, 'index.html') : null;
  if (clientDir && existsSync(clientDir)) {
    router.use(
      '/assets',
      express.static(join(clientDir, 'assets'), { immutable: true, maxAge: '1y', index: false, fallthrough: true }),
    );
    router.use(express.static(clientDir, { index: false, maxAge: 0 }));
  }
  // A missing hashed asset (an old tab after a deploy) must not become index.html, which the
  // browser would try to run as a script.
  router.use('/assets', (_req, res) => {
    res.status(404).type('text/plain').send('Not found');
  });
  router.get('/{*splat}', (req, res, next) => {
    if (req.path === '/api' || req.path.startsWith('/api/')) return next();
    if (index && existsSync(index)) {
      res.setHeader('Cache-Control', 'no-cache');
      // dotfiles: the install folder itself may sit under a dot-directory; the file is fixed.
      res.sendFile(index, { dotfiles: 'allow' });
      return;
    }
    res
      .status(503)
      .type('html')
      .send(
        '<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Planewright</title></head>' +
          '<body><h1>Planewright</h1><p>The client has not been built yet. Run <code>npm run build</code> ' +
          '(or start with <code>npm start</code>, which builds it), then reload this page.</p></body></html>',
      );
  });
  return router;
}
