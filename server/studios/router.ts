import { Router } from 'express';
import { z } from 'zod';
import { idParam } from '../../shared/api/common.js';
import { createStudioBodySchema, updateMemberBodySchema } from '../../shared/api/studios.js';
import type { AppContext } from '../context.js';
import { defineRoutes, type RouteRegistry } from '../http/routes.js';
import { studiosService } from './service.js';

const studioParams = z.object({ studioId: idParam });
const memberParams = z.object({ studioId: idParam, userId: idParam });

export function studiosRouter(ctx: AppContext, registry: RouteRegistry): Router {
  const router = Router();
  const r = defineRoutes(router, registry, '/api/studios');
  const service = studiosService(ctx);
  const inStudio = (i: { params: { studioId: number } }) => ({ studioId: i.params.studioId });

  r.get('/', { action: 'studio.list' }, async ({ res, actor }) => {
    res.json(await service.list(actor!));
  });

  r.post('/', { action: 'studio.create', schemas: { body: createStudioBodySchema } }, async ({ res, actor, input }) => {
    res.status(201).json(await service.create(actor!, input.body));
  });

  r.get('/:studioId', { action: 'studio.view', schemas: { params: studioParams }, resource: inStudio }, async ({ res, actor, input }) => {
    res.json(await service.get(actor!, input.params.studioId));
  });

  r.get('/:studioId/members', { action: 'studio.members.list', schemas: { params: studioParams }, resource: inStudio }, async ({ res, input }) => {
    res.json(await service.members(input.params.studioId));
  });

  r.patch(
    '/:studioId/members/:userId',
    { action: 'studio.members.manage', schemas: { params: memberParams, body: updateMemberBodySchema }, resource: inStudio },
    async ({ res, input }) => {
      res.json(await service.setRole(input.params.studioId, input.params.userId, input.body.role));
    },
  );

  r.delete('/:studioId/members/:userId', { action: 'studio.members.manage', schemas: { params: memberParams }, resource: inStudio }, async ({ res, input }) => {
    await service.remove(input.params.studioId, input.params.userId);
    res.status(204).end();
  });

  return router;
}
