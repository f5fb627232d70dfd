import { Router } from 'express';
import { z } from 'zod';
import { idParam } from '../../shared/api/common.js';
import { createMaterialBodySchema, updateMaterialBodySchema } from '../../shared/api/materials.js';
import type { AppContext } from '../context.js';
import { defineRoutes, type RouteRegistry } from '../http/routes.js';
import { materialsService } from './service.js';

const materialParams = z.object({ materialId: idParam });

export function materialsRouter(ctx: AppContext, registry: RouteRegistry): Router {
  const router = Router();
  const r = defineRoutes(router, registry, '/api/materials');
  const service = materialsService(ctx);

  r.get('/', { action: 'material.list' }, async ({ res }) => {
    res.json(await service.list());
  });
  r.post('/', { action: 'material.manage', schemas: { body: createMaterialBodySchema } }, async ({ res, input }) => {
    res.status(201).json(await service.create(input.body));
  });
  r.patch('/:materialId', { action: 'material.manage', schemas: { params: materialParams, body: updateMaterialBodySchema } }, async ({ res, input }) => {
    res.json(await service.update(input.params.materialId, input.body));
  });
  r.delete('/:materialId', { action: 'material.manage', schemas: { params: materialParams } }, async ({ res, input }) => {
    await service.remove(input.params.materialId);
    res.status(204).end();
  });
  return router;
}
