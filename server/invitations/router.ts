import { Router } from 'express';
import { z } from 'zod';
import { idParam } from '../../shared/api/common.js';
import { acceptInvitationBodySchema, inviteBodySchema } from '../../shared/api/studios.js';
import type { AppContext } from '../context.js';
import { defineRoutes, type RouteRegistry } from '../http/routes.js';
import { loadSessionUser } from '../db/session-user.js';
import { invitationsService } from './service.js';

const studioParams = z.object({ studioId: idParam });
const invitationParams = z.object({ studioId: idParam, invitationId: idParam });
const tokenParams = z.object({ token: z.string().min(20, 'This invitation link is incomplete').max(200) });

export function invitationsRouter(ctx: AppContext, registry: RouteRegistry): Router {
  const router = Router();
  const r = defineRoutes(router, registry, '/api');
  const service = invitationsService(ctx);
  const inStudio = (i: { params: { studioId: number } }) => ({ studioId: i.params.studioId });

  r.get('/studios/:studioId/invitations', { action: 'studio.invitations.manage', schemas: { params: studioParams }, resource: inStudio }, async ({ res, input }) => {
    res.json(await service.list(input.params.studioId));
  });

  r.post(
    '/studios/:studioId/invitations',
    { action: 'studio.invitations.manage', schemas: { params: studioParams, body: inviteBodySchema }, resource: inStudio },
    async ({ res, input, req }) => {
      res.status(201).json(await service.invite(req.user!, input.params.studioId, input.body));
    },
  );

  r.delete(
    '/studios/:studioId/invitations/:invitationId',
    { action: 'studio.invitations.manage', schemas: { params: invitationParams }, resource: inStudio },
    async ({ res, input }) => {
      await service.revoke(input.params.studioId, input.params.invitationId);
      res.status(204).end();
    },
  );

  r.get('/invitations/:token', { action: 'invitation.open', schemas: { params: tokenParams } }, async ({ res, input }) => {
    res.json(await service.preview(input.params.token));
  });

  r.post(
    '/invitations/:token/accept',
    { action: 'invitation.open', schemas: { params: tokenParams, body: acceptInvitationBodySchema } },
    async ({ req, res, input, actor }) => {
      const { userId, created } = await service.accept(actor, input.params.token, input.body);
      const me = (await loadSessionUser(ctx.dataSource, userId))!;
      if (created) {
        // The newcomer is signed in at once (passport regenerates the session id).
        await new Promise<void>((resolve, reject) => req.logIn(me, (err) => (err ? reject(err) : resolve())));
      }
      res.status(201).json(me);
    },
  );

  return router;
}
