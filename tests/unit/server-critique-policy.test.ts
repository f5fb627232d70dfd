/**
 * The critique's rules in the one policy module: who may list, place, answer, resolve and
 * recategorise pins, see and run pin-ups, and score, mark and read feedback. Resources are built
 * the way the routes build them (studio, brief state, gallery, owner, assigned critics, author).
 */
import { describe, expect, it } from 'vitest';
import { decide, type Action, type Actor, type Resource } from '../../server/policy/policy.js';

const S = 7;
const actor = (id: number, over: Partial<Actor> = {}): Actor => ({ id, email: `u${id}@example.org`, globalRole: null, memberships: [], ...over });
const admin = actor(1, { globalRole: 'admin' });
const technician = actor(2, { globalRole: 'technician' });
const instructor = actor(3, { memberships: [{ studioId: S, role: 'instructor' }] });
const assigned = actor(4, { memberships: [{ studioId: S, role: 'critic' }] });
const otherCritic = actor(5, { memberships: [{ studioId: S, role: 'critic' }] });
const owner = actor(6, { memberships: [{ studioId: S, role: 'participant' }] });
const otherParticipant = actor(7, { memberships: [{ studioId: S, role: 'participant' }] });
const outsider = actor(8, { memberships: [{ studioId: S + 1, role: 'instructor' }] });

const WHO = { admin, technician, instructor, assigned, otherCritic, owner, otherParticipant, outsider };
type Who = keyof typeof WHO;

const submission = (over: Resource = {}): Resource => ({ studioId: S, briefState: 'published', galleryOpen: false, ownerId: owner.id, criticIds: [assigned.id], ...over });

function allowed(action: Action, resource: Resource): Who[] {
  return (Object.keys(WHO) as Who[]).filter((w) => decide(WHO[w], action, resource).allowed);
}

describe('critique policy', () => {
  it('lists pins for whoever may see the submission, gallery rule included', () => {
    expect(allowed('pin.list', submission())).toEqual(['admin', 'instructor', 'assigned', 'owner']);
    expect(allowed('pin.list', submission({ galleryOpen: true }))).toEqual(['admin', 'instructor', 'assigned', 'owner', 'otherParticipant']);
  });

  it('lets only admins, instructors and the assigned critics place pins and score', () => {
    for (const a of ['pin.create', 'feedback.score'] as const) {
      expect(allowed(a, submission()), a).toEqual(['admin', 'instructor', 'assigned']);
      // An open gallery lets participants look, not pin or score.
      expect(allowed(a, submission({ galleryOpen: true })), a).toEqual(['admin', 'instructor', 'assigned']);
    }
    const d = decide(otherCritic, 'pin.create', submission());
    expect(d).toEqual({ allowed: false, status: 403, message: 'Only an instructor or a critic assigned to this submission can place pins.' });
    expect(decide(null, 'pin.create', submission())).toMatchObject({ allowed: false, status: 401 });
  });

  it('opens the thread, the resolve button and the feedback to the participant it is about', () => {
    for (const a of ['pin.reply', 'pin.update', 'feedback.view'] as const) {
      expect(allowed(a, submission()), a).toEqual(['admin', 'instructor', 'assigned', 'owner']);
      expect(allowed(a, submission({ galleryOpen: true })), a).toEqual(['admin', 'instructor', 'assigned', 'owner']);
    }
    expect(decide(outsider, 'pin.reply', submission())).toMatchObject({ allowed: false, status: 403, message: 'You are not a member of this studio.' });
  });

  it('lets the author or an instructor change a pin\u2019s category', () => {
    expect(allowed('pin.categorize', submission({ authorId: assigned.id }))).toEqual(['admin', 'instructor', 'assigned']);
    expect(allowed('pin.categorize', submission({ authorId: instructor.id }))).toEqual(['admin', 'instructor']);
    // An author who left the studio no longer can.
    expect(decide(actor(4), 'pin.categorize', submission({ authorId: 4 })).allowed).toBe(false);
    expect(allowed('pin.categorize', submission({ authorId: null }))).toEqual(['admin', 'instructor']);
  });

  it('shows pin-ups to members who may see the brief and lets only instructors run them', () => {
    const brief = { studioId: S, briefState: 'published' as const, galleryOpen: false };
    for (const a of ['pinup.list', 'pinup.view'] as const) {
      expect(allowed(a, brief), a).toEqual(['admin', 'instructor', 'assigned', 'otherCritic', 'owner', 'otherParticipant']);
      expect(allowed(a, { ...brief, briefState: 'draft' }), a).toEqual(['admin', 'instructor']);
    }
    expect(allowed('pinup.manage', brief)).toEqual(['admin', 'instructor']);
    expect(allowed('feedback.mark', submission())).toEqual(['admin', 'instructor']);
  });
});
