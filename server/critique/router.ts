/**
 * The critique's routes: pins and their threads on a revision, pin-ups of a brief, and rubric
 * feedback of a submission. Each names a policy action; the services check the rest (latest
 * revision, anchors on pieces, rubric levels, state moves).
 */
import { Router } from 'express';
import { z } from 'zod';
import { idParam } from '../../shared/api/common.js';
import {
  createCommentBodySchema,
  createPinBodySchema,
  createPinupBodySchema,
  putFeedbackBodySchema,
  putScoresBodySchema,
  updatePinBodySchema,
  updatePinupBodySchema,
} from '../../shared/api/critique.js';
import { briefResource, revisionResource, submissionResource } from '../briefs/access.js';
import type { AppContext } from '../context.js';
import { defineRoutes, type RouteRegistry } from '../http/routes.js';
import { thumbnailPng } from '../thumbnails/service.js';
import { pinResource, pinupResource } from './access.js';
import { feedbackService } from './feedback-service.js';
import type { ThumbnailSource } from './mails.js';
import { pinsService } from './pins-service.js';
import { pinupsService } from './pinups-service.js';

const revisionParams = z.object({ revisionId: idParam });
const pinParams = z.object({ pinId: idParam });
const briefParams = z.object({ briefId: idParam });
const pinupParams = z.object({ pinupId: idParam });
const submissionParams = z.object({ submissionId: idParam });

export function critiqueRouter(ctx: AppContext, registry: RouteRegistry, options: { thumbnail?: ThumbnailSource } = {}): Router {
  const router = Router();
  const r = defineRoutes(router, registry, '/api');
  const ds = ctx.dataSource;
  // The pin-created mail shows the revision's model inline (the stored thumbnail, drawn once).
  const pins = pinsService(ctx, { thumbnail: options.thumbnail ?? ((revisionId) => thumbnailPng(ctx, revisionId)) });
  const pinups = pinupsService(ctx);
  const feedback = feedbackService(ctx);
  const ofRevision = (i: { params: { revisionId: number } }) => revisionResource(ds, i.params.revisionId);
  const ofPin = (i: { params: { pinId: number } }) => pinResource(ds, i.params.pinId);
  const ofBrief = (i: { params: { briefId: number } }) => briefResource(ds, i.params.briefId);
  const ofPinup = (i: { params: { pinupId: number } }) => pinupResource(ds, i.params.pinupId);
  const ofSubmission = (i: { params: { submissionId: number } }) => submissionResource(ds, i.params.submissionId);

  // Pins and threads
  r.get('/revisions/:revisionId/pins', { action: 'pin.list', schemas: { params: revisionParams }, resource: ofRevision }, ({ res, actor, input }) => {
    res.json(pins.list(actor!, input.params.revisionId, revisionResource(ds, input.params.revisionId)));
  });
  r.post('/revisions/:revisionId/pins', { action: 'pin.create', schemas: { params: revisionParams, body: createPinBodySchema }, resource: ofRevision }, async ({ res, actor, input }) => {
    res.status(201).json(await pins.create(actor!, input.params.revisionId, input.body));
  });
  r.post('/pins/:pinId/comments', { action: 'pin.reply', schemas: { params: pinParams, body: createCommentBodySchema }, resource: ofPin }, async ({ res, actor, input }) => {
    res.status(201).json(await pins.reply(actor!, input.params.pinId, input.body.body));
  });
  r.patch('/pins/:pinId', { action: 'pin.update', schemas: { params: pinParams, body: updatePinBodySchema }, resource: ofPin }, async ({ res, actor, input }) => {
    res.json(await pins.update(actor!, input.params.pinId, input.body, pinResource(ds, input.params.pinId)));
  });

  // Pin-ups
  r.get('/briefs/:briefId/pinups', { action: 'pinup.list', schemas: { params: briefParams }, resource: ofBrief }, ({ res, actor, input }) => {
    res.json(pinups.list(actor!, input.params.briefId));
  });
  r.post('/briefs/:briefId/pinups', { action: 'pinup.manage', schemas: { params: briefParams, body: createPinupBodySchema }, resource: ofBrief }, async ({ res, actor, input }) => {
    res.status(201).json(await pinups.create(actor!, input.params.briefId, input.body));
  });
  r.get('/pinups/:pinupId', { action: 'pinup.view', schemas: { params: pinupParams }, resource: ofPinup }, ({ res, actor, input }) => {
    res.json(pinups.get(actor!, input.params.pinupId));
  });
  r.patch('/pinups/:pinupId', { action: 'pinup.manage', schemas: { params: pinupParams, body: updatePinupBodySchema }, resource: ofPinup }, async ({ res, actor, input }) => {
    res.json(await pinups.update(actor!, input.params.pinupId, input.body));
  });
  r.delete('/pinups/:pinupId', { action: 'pinup.manage', schemas: { params: pinupParams }, resource: ofPinup }, ({ res, input }) => {
    pinups.remove(input.params.pinupId);
    res.status(204).end();
  });

  // Rubric feedback
  r.get('/submissions/:submissionId/feedback', { action: 'feedback.view', schemas: { params: submissionParams }, resource: ofSubmission }, ({ res, actor, input }) => {
    res.json(feedback.view(actor!, input.params.submissionId, submissionResource(ds, input.params.submissionId)));
  });
  r.put('/submissions/:submissionId/scores', { action: 'feedback.score', schemas: { params: submissionParams, body: putScoresBodySchema }, resource: ofSubmission }, async ({ res, actor, input }) => {
    res.json(await feedback.putScores(actor!, input.params.submissionId, input.body, submissionResource(ds, input.params.submissionId)));
  });
  r.put('/submissions/:submissionId/feedback', { action: 'feedback.mark', schemas: { params: submissionParams, body: putFeedbackBodySchema }, resource: ofSubmission }, async ({ res, actor, input }) => {
    res.json(await feedback.putFeedback(actor!, input.params.submissionId, input.body, submissionResource(ds, input.params.submissionId)));
  });
  r.post('/submissions/:submissionId/feedback/release', { action: 'feedback.mark', schemas: { params: submissionParams }, resource: ofSubmission }, async ({ res, actor, input }) => {
    res.json(await feedback.release(actor!, input.params.submissionId, submissionResource(ds, input.params.submissionId)));
  });
  return router;
}
