import { Router } from 'express';
import { z } from 'zod';
import { createBriefBodySchema, submissionsQuerySchema, updateBriefBodySchema } from '../../shared/api/briefs.js';
import { idParam } from '../../shared/api/common.js';
import type { AppContext } from '../context.js';
import { Material } from '../db/entities/index.js';
import { defineRoutes, type RouteRegistry } from '../http/routes.js';
import { briefResource } from './access.js';
import { briefsService } from './service.js';
import { sendDrawingTemplate } from './template-response.js';
import { templateDesignOf } from './template-design.js';

const studioParams = z.object({ studioId: idParam });
const briefParams = z.object({ briefId: idParam });
const templateParams = z.object({ briefId: idParam, familyId: z.string().min(1).max(64) });

export function briefsRouter(ctx: AppContext, registry: RouteRegistry): Router {
  const router = Router();
  const r = defineRoutes(router, registry, '/api');
  const service = briefsService(ctx);
  const ofBrief = (i: { params: { briefId: number } }) => briefResource(ctx.dataSource, i.params.briefId);
  const inStudio = (i: { params: { studioId: number } }) => ({ studioId: i.params.studioId });

  r.get('/studios/:studioId/briefs', { action: 'brief.list', schemas: { params: studioParams }, resource: inStudio }, async ({ res, actor, input }) => {
    res.json(await service.list(actor!, input.params.studioId));
  });
  r.post('/studios/:studioId/briefs', { action: 'brief.manage', schemas: { params: studioParams, body: createBriefBodySchema }, resource: inStudio }, async ({ res, actor, input }) => {
    res.status(201).json(await service.create(actor!, input.params.studioId, input.body));
  });
  r.get('/briefs/:briefId', { action: 'brief.view', schemas: { params: briefParams }, resource: ofBrief }, async ({ res, actor, input }) => {
    res.json(await service.get(actor!, input.params.briefId));
  });
  r.patch('/briefs/:briefId', { action: 'brief.manage', schemas: { params: briefParams, body: updateBriefBodySchema }, resource: ofBrief }, async ({ res, actor, input }) => {
    res.json(await service.update(actor!, input.params.briefId, input.body));
  });
  r.post('/briefs/:briefId/publish', { action: 'brief.manage', schemas: { params: briefParams }, resource: ofBrief }, async ({ res, actor, input }) => {
    res.json(await service.publish(actor!, input.params.briefId));
  });
  r.post('/briefs/:briefId/close', { action: 'brief.manage', schemas: { params: briefParams }, resource: ofBrief }, async ({ res, actor, input }) => {
    res.json(await service.close(actor!, input.params.briefId));
  });
  r.get('/briefs/:briefId/changes', { action: 'brief.view', schemas: { params: briefParams }, resource: ofBrief }, async ({ res, input }) => {
    res.json(await service.changes(input.params.briefId));
  });
  r.get('/briefs/:briefId/templates/:familyId', { action: 'brief.view', schemas: { params: templateParams }, resource: ofBrief }, async ({ res, actor, input }) => {
    const b = await service.get(actor!, input.params.briefId);
    const m = (await ctx.dataSource.getRepository(Material).findOneBy({ id: b.constraints.materialId }))!;
    const doc = templateDesignOf(b.title, b.constraints, { name: m.name, thickness: m.thickness, kerf: m.kerf });
    sendDrawingTemplate(res, doc, input.params.familyId, `brief-${b.id}`);
  });
  r.get(
    '/briefs/:briefId/submissions',
    { action: 'brief.submissions.list', schemas: { params: briefParams, query: submissionsQuerySchema }, resource: ofBrief },
    async ({ res, actor, input }) => {
      res.json(await service.submissions(actor!, input.params.briefId, input.query));
    },
  );
  r.get('/briefs/:briefId/export', { action: 'brief.export', schemas: { params: briefParams }, resource: ofBrief }, async ({ res, actor, input }) => {
    const { filename, csv } = await service.exportCsv(actor!, input.params.briefId);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="${filename}"`);
    res.send(csv);
  });
  r.post('/briefs/:briefId/reaudit', { action: 'brief.manage', schemas: { params: briefParams }, resource: ofBrief }, async ({ res, input }) => {
    res.json({ queued: service.reauditAll(input.params.briefId) });
  });
  return router;
}
