import { Router } from 'express';
import { updateNotificationSettingsBodySchema } from '../../shared/api/notifications.js';
import type { AppContext } from '../context.js';
import { defineRoutes, type RouteRegistry } from '../http/routes.js';
import { notifier } from './service.js';

export function notificationsRouter(ctx: AppContext, registry: RouteRegistry): Router {
  const router = Router();
  const r = defineRoutes(router, registry, '/api/me');
  const service = notifier(ctx);
  r.get('/notifications', { action: 'notifications.manage' }, async ({ res, actor }) => {
    res.json(await service.settings(actor!.id));
  });
  r.put('/notifications', { action: 'notifications.manage', schemas: { body: updateNotificationSettingsBodySchema } }, async ({ res, actor, input }) => {
    res.json(await service.update(actor!.id, input.body));
  });
  return router;
}
