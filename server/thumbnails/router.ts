import { Router } from 'express';
import { z } from 'zod';
import { idParam } from '../../shared/api/common.js';
import { revisionResource } from '../briefs/access.js';
import type { AppContext } from '../context.js';
import { NotFoundError } from '../http/errors.js';
import { defineRoutes, type RouteRegistry } from '../http/routes.js';
import { thumbnailPng } from './service.js';

const revisionParams = z.object({ revisionId: idParam });

/** How long a browser may keep a thumbnail without asking again (s); it changes only with the design or the brief's material. */
export const THUMBNAIL_MAX_AGE_S = 3600;

/**
 * `GET /api/revisions/:revisionId/thumbnail`: the model's picture as image/png, for whoever may
 * open the revision (the same policy action and resource as `GET /api/revisions/:revisionId`).
 * Mounted at the app root like the revisions router: `app.use('/api', thumbnailsRouter(ctx, registry))`.
 */
export function thumbnailsRouter(ctx: AppContext, registry: RouteRegistry): Router {
  const router = Router();
  const r = defineRoutes(router, registry, '/api');
  r.get(
    '/revisions/:revisionId/thumbnail',
    { action: 'submission.view', schemas: { params: revisionParams }, resource: (i) => revisionResource(ctx.dataSource, i.params.revisionId) },
    async ({ res, input }) => {
      const png = await thumbnailPng(ctx, input.params.revisionId);
      if (!png) throw new NotFoundError('This revision has no picture: its design could not be read into a model, or it has no pieces.');
      res.setHeader('Content-Type', 'image/png');
      res.setHeader('X-Content-Type-Options', 'nosniff');
      res.setHeader('Cache-Control', `private, max-age=${THUMBNAIL_MAX_AGE_S}`);
      res.setHeader('Content-Disposition', `inline; filename="revision-${input.params.revisionId}-model.png"`);
      res.send(png);
    },
  );
  return router;
}
