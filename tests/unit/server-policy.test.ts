import { describe, expect, it } from 'vitest';
import { ACTIONS, can, decide, studioRole, type Actor } from '../../server/policy/policy.js';

const S = 7;
const OTHER = 8;
const actor = (over: Partial<Actor> = {}): Actor => ({ id: 1, email: 'a@example.org', globalRole: null, memberships: [], ...over });
const admin = actor({ globalRole: 'admin' });
const technician = actor({ globalRole: 'technician' });
const instructor = actor({ memberships: [{ studioId: S, role: 'instructor' }] });
const critic = actor({ memberships: [{ studioId: S, role: 'critic' }, { studioId: OTHER, role: 'instructor' }] });
const participant = actor({ memberships: [{ studioId: S, role: 'participant' }] });

describe('decide', () => {
  it('answers every action for every kind of caller without throwing', () => {
    for (const a of ACTIONS) for (const who of [null, admin, technician, instructor, critic, participant]) {
      const d = decide(who, a, { studioId: S, invitedEmail: 'x@example.org', accountExists: false });
      expect(typeof d.allowed).toBe('boolean');
    }
  });

  it('when signed out, allows only the public actions and asks for sign-in otherwise', () => {
    const open = ACTIONS.filter((a) => can(null, a));
    expect(open.sort()).toEqual(['auth.login', 'auth.logout', 'auth.password-reset', 'health.read', 'invitation.accept', 'invitation.open'].sort());
    expect(decide(null, 'studio.list')).toEqual({ allowed: false, status: 401, message: 'Sign in to continue.' });
  });

  it('when the caller is an admin, allows everything in every studio', () => {
    for (const a of ACTIONS) expect(can(admin, a, { studioId: 12345, invitedEmail: 'a@example.org' }), a).toBe(true);
  });

  it('when the caller is a technician with no membership, refuses studio and admin actions with 403', () => {
    for (const a of ['studio.view', 'studio.members.list', 'studio.members.manage', 'studio.invitations.manage', 'studio.create', 'admin.users.list', 'admin.outbox.read'] as const) {
      const d = decide(technician, a, { studioId: S });
      expect(d.allowed, a).toBe(false);
      if (!d.allowed) expect(d.status).toBe(403);
    }
    expect(can(technician, 'studio.list')).toBe(true);
  });

  it('lets an instructor manage only their own studio', () => {
    expect(can(instructor, 'studio.members.manage', { studioId: S })).toBe(true);
    expect(can(instructor, 'studio.invitations.manage', { studioId: S })).toBe(true);
    expect(can(instructor, 'studio.members.manage', { studioId: OTHER })).toBe(false);
    expect(can(instructor, 'studio.create')).toBe(false);
  });

  it('uses the role held in that studio when a person has different roles in different studios', () => {
    expect(can(critic, 'studio.members.manage', { studioId: S })).toBe(false);
    expect(can(critic, 'studio.members.manage', { studioId: OTHER })).toBe(true);
    expect(studioRole(critic, S)).toBe('critic');
    expect(studioRole(critic, 99)).toBeNull();
  });

  it('shows the roster to critics and participants but lets them change nothing', () => {
    for (const who of [critic, participant]) {
      expect(can(who, 'studio.view', { studioId: S })).toBe(true);
      expect(can(who, 'studio.members.list', { studioId: S })).toBe(true);
      expect(can(who, 'studio.invitations.manage', { studioId: S })).toBe(false);
    }
  });

  it('when no studio is named, refuses studio actions to non-admins', () => {
    expect(can(instructor, 'studio.view')).toBe(false);
  });
});

describe('invitation.accept', () => {
  it('lets a newcomer accept without an account', () => {
    expect(can(null, 'invitation.accept', { invitedEmail: 'new@example.org', accountExists: false })).toBe(true);
  });

  it('asks an existing account to sign in first, naming the address', () => {
    const d = decide(null, 'invitation.accept', { invitedEmail: 'old@example.org', accountExists: true });
    expect(d).toMatchObject({ allowed: false, status: 401 });
    if (!d.allowed) expect(d.message).toContain('old@example.org');
  });

  it('lets the invited account accept, ignoring the case of the address', () => {
    expect(can(actor({ email: 'Kim@Example.org' }), 'invitation.accept', { invitedEmail: 'kim@example.org', accountExists: true })).toBe(true);
  });

  it('refuses someone signed in as another address with 403 naming both', () => {
    const d = decide(actor({ email: 'me@example.org' }), 'invitation.accept', { invitedEmail: 'you@example.org', accountExists: false });
    expect(d).toMatchObject({ allowed: false, status: 403 });
    if (!d.allowed) {
      expect(d.message).toContain('you@example.org');
      expect(d.message).toContain('me@example.org');
    }
  });
});
