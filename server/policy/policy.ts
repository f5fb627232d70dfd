/**
 * The one place that decides who may do what. Every API route names an action and asks
 * `decide` before its handler runs; services ask it again where the answer depends on data
 * loaded later (accepting an invitation).
 *
 * Roles: global `admin` (runs the maker space: every studio, users, outbox) and `technician`
 * (the cut queue; no studio rights of its own); per studio `instructor`, `critic`,
 * `participant`. A person may hold different roles in different studios.
 *
 * Decisions worth knowing:
 * - Anonymous callers get 401 for everything that needs an account; signed-in callers without
 *   the right get 403 (also for studios they are not in, so ids do not reveal membership).
 * - The studio roster (names, roles and e-mail addresses) is visible to every member of that
 *   studio, so participants can reach their critics and each other; outsiders and technicians
 *   who are not members see nothing of it.
 * - Instructors manage members and invitations of their own studios; admins may do the same
 *   in every studio (they run the space), and only admins create studios or change global roles.
 * - An invitation is accepted by a newcomer (no account with the invited address) without
 *   signing in, or by the invited account while signed in as it; anyone else is refused with the
 *   address the invitation is for.
 * - Briefs: members read published and closed briefs; drafts only instructors (and admins).
 *   Instructors write their studios' briefs. The material catalogue is read by everyone signed
 *   in and written by admins.
 * - Submissions: a participant sees their own, and the others' only once the instructor opens
 *   the brief's gallery; a critic only those assigned to them; instructors every submission in
 *   their studios; admins all. Only participants of the studio (and admins, who may do anything)
 *   submit revisions, and only to a brief that is not a draft. A failed audit is retried by its owner or an instructor.
 * - Critique: whoever may see a submission sees its pins. Pins are placed by the studio's
 *   instructors and by critics assigned to the submission (never by other critics or by
 *   participants). The thread is open to those and to the submission's participant, who may
 *   also resolve or reopen a pin; a pin's category is changed only by its author or an
 *   instructor. Pin-ups (critique sessions) are seen by members who may see the brief (each
 *   entry then filtered by the submission rule) and run by instructors. Rubric scores are
 *   entered by instructors and assigned critics (each their own sheet); the final mark, the
 *   summary and the release are the instructor's. Feedback is read by instructors, the
 *   assigned critics and the participant it is for (the service shows the participant
 *   nothing but "not released" until it is).
 */
import type { BriefState } from '../../shared/api/briefs.js';
import type { GlobalRole, StudioRole } from '../../shared/api/roles.js';

export interface Actor {
  id: number;
  email: string;
  globalRole: GlobalRole | null;
  memberships: ReadonlyArray<{ studioId: number; role: StudioRole }>;
}

export const ACTIONS = [
  'health.read',
  'auth.login',
  'auth.logout',
  'auth.me',
  'auth.password-reset',
  'studio.list',
  'studio.create',
  'studio.view',
  'studio.members.list',
  'studio.members.manage',
  'studio.invitations.manage',
  'invitation.open',
  'invitation.accept',
  'admin.users.list',
  'admin.users.manage',
  'admin.outbox.read',
  'material.list',
  'material.manage',
  'brief.list',
  'brief.view',
  'brief.manage',
  'brief.export',
  'brief.submissions.list',
  'revision.create',
  'submission.view',
  'submission.critics.manage',
  'revision.retry',
  'notifications.manage',
  'pin.list',
  'pin.create',
  'pin.reply',
  'pin.update',
  'pin.categorize',
  'pinup.list',
  'pinup.view',
  'pinup.manage',
  'feedback.view',
  'feedback.score',
  'feedback.mark',
] as const;
export type Action = (typeof ACTIONS)[number];

export interface Resource {
  studioId?: number;
  /** For `invitation.accept`: the invited address and whether an account has it. */
  invitedEmail?: string;
  accountExists?: boolean;
  /** For briefs and what hangs off them: the brief's state and whether its gallery is open. */
  briefState?: BriefState;
  galleryOpen?: boolean;
  /** For a submission: its participant and the critics assigned to it. */
  ownerId?: number;
  criticIds?: readonly number[];
  /** For a pin: who placed it (`pin.categorize`). */
  authorId?: number | null;
}

export type Decision = { allowed: true } | { allowed: false; status: 401 | 403; message: string };

const ALLOW: Decision = { allowed: true };
const SIGN_IN: Decision = { allowed: false, status: 401, message: 'Sign in to continue.' };
const deny = (message: string): Decision => ({ allowed: false, status: 403, message });

/** The caller's role in a studio, or null. */
export function studioRole(actor: Actor | null, studioId: number | undefined): StudioRole | null {
  if (!actor || studioId === undefined) return null;
  return actor.memberships.find((m) => m.studioId === studioId)?.role ?? null;
}

export const isAdmin = (actor: Actor | null): boolean => actor?.globalRole === 'admin';

/** Decides whether `actor` (null when signed out) may perform `action` on `resource`. */
export function decide(actor: Actor | null, action: Action, resource: Resource = {}): Decision {
  switch (action) {
    case 'health.read':
    case 'auth.login':
    case 'auth.logout':
    case 'auth.password-reset':
    case 'invitation.open':
      return ALLOW;
    case 'invitation.accept': {
      const invited = resource.invitedEmail?.toLowerCase();
      if (!actor) {
        if (resource.accountExists) {
          return { allowed: false, status: 401, message: `An account for ${invited} already exists. Sign in as ${invited}, then accept the invitation.` };
        }
        return ALLOW;
      }
      if (invited !== undefined && actor.email.toLowerCase() === invited) return ALLOW;
      return deny(`This invitation is for ${invited}, but you are signed in as ${actor.email}. Sign out and open the link again, or sign in as ${invited}.`);
    }
  }
  if (!actor) return SIGN_IN;
  switch (action) {
    case 'auth.me':
    case 'studio.list':
    case 'material.list':
    case 'notifications.manage':
      return ALLOW;
    case 'material.manage':
      return isAdmin(actor) ? ALLOW : deny('Only an admin can change the material catalogue.');
    case 'studio.create':
    case 'admin.users.list':
    case 'admin.users.manage':
    case 'admin.outbox.read':
      return isAdmin(actor) ? ALLOW : deny('Only an admin can do that.');
    case 'studio.view':
    case 'studio.members.list':
      return isAdmin(actor) || studioRole(actor, resource.studioId) ? ALLOW : deny('You are not a member of this studio.');
    case 'studio.members.manage':
    case 'studio.invitations.manage':
    case 'brief.manage':
    case 'brief.export':
    case 'submission.critics.manage':
      return isAdmin(actor) || studioRole(actor, resource.studioId) === 'instructor'
        ? ALLOW
        : deny('Only an instructor of this studio can do that.');
    case 'brief.list':
      return isAdmin(actor) || studioRole(actor, resource.studioId) ? ALLOW : deny('You are not a member of this studio.');
    case 'brief.view':
    case 'brief.submissions.list': {
      const role = studioRole(actor, resource.studioId);
      if (isAdmin(actor) || role === 'instructor') return ALLOW;
      if (!role) return deny('You are not a member of this studio.');
      return resource.briefState === 'draft' ? deny('This brief is a draft; only instructors see it until it is published.') : ALLOW;
    }
    case 'revision.create': {
      if (isAdmin(actor)) return ALLOW;
      const role = studioRole(actor, resource.studioId);
      if (role !== 'participant') return deny('Only participants of this studio submit revisions.');
      return resource.briefState === 'draft' ? deny('This brief is a draft; only instructors see it until it is published.') : ALLOW;
    }
    case 'submission.view':
    case 'pin.list': {
      const role = studioRole(actor, resource.studioId);
      if (isAdmin(actor) || role === 'instructor') return ALLOW;
      if (role === 'participant' && (resource.ownerId === actor.id || resource.galleryOpen === true)) return ALLOW;
      if (role === 'critic' && (resource.criticIds ?? []).includes(actor.id)) return ALLOW;
      return deny(role ? 'This submission is not yours to see.' : 'You are not a member of this studio.');
    }
    case 'revision.retry': {
      const role = studioRole(actor, resource.studioId);
      if (isAdmin(actor) || role === 'instructor') return ALLOW;
      if (role === 'participant' && resource.ownerId === actor.id) return ALLOW;
      return deny('Only the participant who submitted it or an instructor can retry this audit.');
    }
    case 'pin.create':
    case 'feedback.score': {
      const role = studioRole(actor, resource.studioId);
      if (isAdmin(actor) || role === 'instructor') return ALLOW;
      if (role === 'critic' && (resource.criticIds ?? []).includes(actor.id)) return ALLOW;
      if (!role) return deny('You are not a member of this studio.');
      return deny(
        action === 'pin.create'
          ? 'Only an instructor or a critic assigned to this submission can place pins.'
          : 'Only an instructor or a critic assigned to this submission can score it.',
      );
    }
    case 'pin.reply':
    case 'pin.update':
    case 'feedback.view': {
      const role = studioRole(actor, resource.studioId);
      if (isAdmin(actor) || role === 'instructor') return ALLOW;
      if (role === 'critic' && (resource.criticIds ?? []).includes(actor.id)) return ALLOW;
      if (role === 'participant' && resource.ownerId === actor.id) return ALLOW;
      if (!role) return deny('You are not a member of this studio.');
      return deny(
        action === 'feedback.view'
          ? 'Only the participant, the assigned critics and instructors see this feedback.'
          : 'Only the participant, the assigned critics and instructors take part in this thread.',
      );
    }
    case 'pin.categorize': {
      const role = studioRole(actor, resource.studioId);
      if (isAdmin(actor) || role === 'instructor') return ALLOW;
      if (resource.authorId != null && resource.authorId === actor.id && role !== null) return ALLOW;
      return deny('Only the pin\u2019s author or an instructor can change its category.');
    }
    case 'pinup.list':
    case 'pinup.view': {
      const role = studioRole(actor, resource.studioId);
      if (isAdmin(actor) || role === 'instructor') return ALLOW;
      if (!role) return deny('You are not a member of this studio.');
      return resource.briefState === 'draft' ? deny('This brief is a draft; only instructors see it until it is published.') : ALLOW;
    }
    case 'pinup.manage':
    case 'feedback.mark':
      return isAdmin(actor) || studioRole(actor, resource.studioId) === 'instructor'
        ? ALLOW
        : deny(action === 'pinup.manage' ? 'Only an instructor of this studio runs pin-ups.' : 'Only an instructor of this studio sets and releases the final mark.');
  }
}

export const can = (actor: Actor | null, action: Action, resource?: Resource): boolean => decide(actor, action, resource).allowed;
