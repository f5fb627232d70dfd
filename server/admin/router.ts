import { Router } from 'express';
import { z } from 'zod';
import { updateUserBodySchema } from '../../shared/api/admin.js';
import { idParam } from '../../shared/api/common.js';
import type { AppContext } from '../context.js';
import { defineRoutes, type RouteRegistry } from '../http/routes.js';
import { adminService } from './service.js';

export function adminRouter(ctx: AppContext, registry: RouteRegistry): Router {
  const router = Router();
  const r = defineRoutes(router, registry, '/api/admin');
  const service = adminService(ctx);

  r.get('/users', { action: 'admin.users.list' }, async ({ res }) => {
    res.json(await service.users());
  });

  r.patch(
    '/users/:userId',
    { action: 'admin.users.manage', schemas: { params: z.object({ userId: idParam }), body: updateUserBodySchema } },
    async ({ res, input, actor }) => {
      res.json(await service.setGlobalRole(actor!, input.params.userId, input.body.globalRole));
    },
  );

  r.get('/outbox', { action: 'admin.outbox.read' }, async ({ res }) => {
    res.json(await service.outbox());
  });

  r.get('/outbox/:messageId', { action: 'admin.outbox.read', schemas: { params: z.object({ messageId: idParam }) } }, async ({ res, input }) => {
    res.json(await service.message(input.params.messageId));
  });

  return router;
}
