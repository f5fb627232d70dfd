import { Router } from 'express';
import { z } from 'zod';
import { assignCriticsBodySchema } from '../../shared/api/briefs.js';
import { idParam } from '../../shared/api/common.js';
import type { AppContext } from '../context.js';
import { briefResource, revisionResource, submissionResource } from '../briefs/access.js';
import { sendDrawingTemplate } from '../briefs/template-response.js';
import { defineRoutes, type RouteRegistry } from '../http/routes.js';
import { revisionsService } from './service.js';

// Revisions build on briefs (their access rules and drawing templates); briefs never import revisions.
const briefParams = z.object({ briefId: idParam });
const submissionParams = z.object({ submissionId: idParam });
const revisionParams = z.object({ revisionId: idParam });

export function revisionsRouter(ctx: AppContext, registry: RouteRegistry): Router {
  const router = Router();
  const r = defineRoutes(router, registry, '/api');
  const service = revisionsService(ctx);
  const ofSubmission = (i: { params: { submissionId: number } }) => submissionResource(ctx.dataSource, i.params.submissionId);
  const ofRevision = (i: { params: { revisionId: number } }) => revisionResource(ctx.dataSource, i.params.revisionId);

  r.post(
    '/briefs/:briefId/revisions',
    { action: 'revision.create', schemas: { params: briefParams }, resource: (i) => briefResource(ctx.dataSource, i.params.briefId) },
    async ({ req, res, actor, input }) => {
      res.status(201).json(await service.create(actor!, input.params.briefId, req, res));
    },
  );
  r.get('/submissions/:submissionId', { action: 'submission.view', schemas: { params: submissionParams }, resource: ofSubmission }, ({ res, input }) => {
    res.json(service.submission(input.params.submissionId));
  });
  r.get('/submissions/:submissionId/history', { action: 'submission.view', schemas: { params: submissionParams }, resource: ofSubmission }, ({ res, input }) => {
    res.json(service.history(input.params.submissionId));
  });
  r.put(
    '/submissions/:submissionId/critics',
    { action: 'submission.critics.manage', schemas: { params: submissionParams, body: assignCriticsBodySchema }, resource: ofSubmission },
    async ({ res, input }) => {
      res.json(await service.assignCritics(input.params.submissionId, input.body.userIds));
    },
  );
  r.get('/revisions/:revisionId', { action: 'submission.view', schemas: { params: revisionParams }, resource: ofRevision }, ({ res, input }) => {
    res.json(service.detail(input.params.revisionId));
  });
  r.get('/revisions/:revisionId/audit', { action: 'submission.view', schemas: { params: revisionParams }, resource: ofRevision }, ({ res, input }) => {
    res.json(service.audit(input.params.revisionId));
  });
  r.post('/revisions/:revisionId/retry', { action: 'revision.retry', schemas: { params: revisionParams }, resource: ofRevision }, ({ res, input }) => {
    res.json(service.retry(input.params.revisionId));
  });
  r.get(
    '/revisions/:revisionId/files/:fileId',
    { action: 'submission.view', schemas: { params: z.object({ revisionId: idParam, fileId: idParam }) }, resource: ofRevision },
    async ({ res, input }) => {
      await service.sendFile(input.params.revisionId, input.params.fileId, res);
    },
  );
  r.get(
    '/revisions/:revisionId/templates/:familyId',
    { action: 'submission.view', schemas: { params: z.object({ revisionId: idParam, familyId: z.string().min(1).max(64) }) }, resource: ofRevision },
    ({ res, input }) => {
      const { doc, baseName } = service.template(input.params.revisionId);
      sendDrawingTemplate(res, doc, input.params.familyId, baseName);
    },
  );
  return router;
}
