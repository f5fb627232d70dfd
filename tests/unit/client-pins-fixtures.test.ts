// Invented pins for the client pin tests (people and pieces are made up).
import { describe, expect, it } from 'vitest';
import { type Pin, type PinComment, type RevisionPins, pinCommentSchema, revisionPinsSchema } from '../../shared/api/critique.js';

export const CRITIC = { id: 3, name: 'Renée Ashcombe', role: 'critic' };
export const PARTICIPANT = { id: 4, name: 'Kofi Mensah-Lowe', role: 'participant' };
export const INSTRUCTOR = { id: 2, name: 'Ilse Varga', role: 'instructor' };

export function comment(id: number, body: string, author = CRITIC, createdAt = '2026-11-30T10:00:00.000Z'): PinComment {
  return { id, author, body, createdAt };
}

export function pin(over: Partial<Pin> & { id: number }): Pin {
  return {
    number: over.id,
    submissionId: 7,
    placedOnRevision: { id: 12, number: 2 },
    revisionId: 12,
    anchor: { piece: 'panel-05', point: [10, 4], side: 1 },
    scope: 'piece',
    category: 'structure',
    state: 'open',
    camera: { position: [400, -300, 250], target: [0, 0, 0] },
    author: { id: CRITIC.id, name: CRITIC.name },
    createdAt: '2026-11-30T10:00:00.000Z',
    updatedAt: '2026-11-30T10:00:00.000Z',
    resolvedBy: null,
    outdated: false,
    comments: [comment(over.id * 100, 'The tab on this panel looks thin for 3 mm birch; widen it.')],
    ...over,
  };
}

export function revisionPins(pins: Pin[], over: Partial<RevisionPins> = {}): RevisionPins {
  return { revisionId: 12, pins, outdatedEarlier: [], canPin: true, version: `v${pins.length}`, ...over };
}

export const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });

// The fixtures keep to the contract, checked once: in this file's own run, not again in each
// test file that imports them.
if (expect.getState().testPath?.endsWith('client-pins-fixtures.test.ts')) {
  describe('pin fixtures', () => {
    it('parse with the shared pin schemas', () => {
      expect(revisionPinsSchema.parse(revisionPins([pin({ id: 1 }), pin({ id: 2, state: 'resolved', scope: 'orbit' })]))).toBeTruthy();
      expect(pinCommentSchema.parse(comment(1, 'x', PARTICIPANT))).toBeTruthy();
    });
  });
}
