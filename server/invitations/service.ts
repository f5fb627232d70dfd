import type { Invitation as InvitationDto, InvitationPreview, InvitationState, InviteBody, AcceptInvitationBody } from '../../shared/api/studios.js';
import { STUDIO_ROLE_LABELS } from '../../shared/api/roles.js';
import type { AppContext } from '../context.js';
import { Studio, type Invitation } from '../db/entities/index.js';
import { ConflictError, GoneError, NotFoundError, ServiceUnavailableError, UnprocessableError } from '../http/errors.js';
import { hashPassword } from '../lib/password.js';
import { hashToken, newToken } from '../lib/tokens.js';
import { simpleHtml } from '../mail/mail-service.js';
import { assertCan } from '../policy/enforce.js';
import type { Actor } from '../policy/policy.js';
import { invitationsRepository } from './repository.js';

export const INVITATION_LIFETIME_MS = 7 * 24 * 60 * 60 * 1000;

export function invitationState(inv: Invitation, now: Date): InvitationState {
  if (inv.acceptedAt) return 'accepted';
  if (inv.revokedAt) return 'revoked';
  if (inv.expiresAt.getTime() <= now.getTime()) return 'expired';
  return 'pending';
}

const dateText = (d: Date) => d.toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });

export function invitationsService(ctx: AppContext) {
  const repo = invitationsRepository(ctx.dataSource);
  const log = ctx.logError ?? console.error;

  const dto = (inv: Invitation, now: Date): InvitationDto => ({
    id: inv.id,
    studioId: inv.studioId,
    email: inv.email,
    role: inv.role,
    state: invitationState(inv, now),
    invitedBy: inv.invitedBy?.name ?? 'a former member',
    createdAt: inv.createdAt.toISOString(),
    expiresAt: inv.expiresAt.toISOString(),
  });

  async function studioOf(studioId: number): Promise<Studio> {
    const s = await ctx.dataSource.getRepository(Studio).findOneBy({ id: studioId });
    if (!s) throw new NotFoundError('There is no studio with this id.');
    return s;
  }

  /** The invitation behind a link, or 404/410 with a message the invited person can act on. */
  async function usable(token: string): Promise<Invitation> {
    const inv = await repo.findByHash(hashToken(token));
    if (!inv) throw new NotFoundError('This invitation link is not valid. Check that the whole link was copied, or ask the instructor for a new invitation.');
    const state = invitationState(inv, ctx.clock.now());
    if (state === 'accepted') throw new GoneError('This invitation has already been used. Sign in to reach the studio, or ask the instructor for a new invitation.', 'invitation_used');
    if (state === 'revoked') throw new GoneError('This invitation was withdrawn by the studio. Ask the instructor for a new one if you still need to join.', 'invitation_revoked');
    if (state === 'expired') throw new GoneError('This invitation has expired (invitations last seven days). Ask the instructor for a new one.', 'invitation_expired');
    return inv;
  }

  return {
    async list(studioId: number): Promise<InvitationDto[]> {
      await studioOf(studioId);
      const now = ctx.clock.now();
      return (await repo.list(studioId)).map((i) => dto(i, now));
    },

    async invite(actor: Actor & { name: string }, studioId: number, body: InviteBody): Promise<InvitationDto> {
      const studio = await studioOf(studioId);
      if (await repo.isMember(studioId, body.email)) {
        throw new ConflictError(`${body.email} is already a member of ${studio.name}. Change their role in the members table instead.`, 'already_member');
      }
      const token = newToken();
      const now = ctx.clock.now();
      const expiresAt = new Date(now.getTime() + INVITATION_LIFETIME_MS);
      const inv = await repo.replacePending({ studioId, email: body.email, role: body.role, tokenHash: hashToken(token), invitedById: actor.id, createdAt: now, expiresAt });
      const link = `${ctx.config.publicUrl}/invitations/${encodeURIComponent(token)}`;
      const role = STUDIO_ROLE_LABELS[body.role].toLowerCase();
      const lines = [
        'Hello,',
        `${actor.name} has invited you to join the studio "${studio.name}" on Planewright as a ${role}.`,
        'Open the link below to accept. If you are new to Planewright you will choose your name and a password there; if you already have an account, sign in with this address and accept.',
        `The link works once and until ${dateText(expiresAt)}.`,
      ];
      try {
        await ctx.mail.send({
          to: body.email,
          subject: `You are invited to ${studio.name} on Planewright`,
          text: `${lines.join('\n\n')}\n\n${link}\n\n— Planewright\n`,
          html: simpleHtml(lines, { href: link, label: `Join ${studio.name}` }),
        });
      } catch (e) {
        log(e);
        await repo.remove(inv.id);
        throw new ServiceUnavailableError('The invitation e-mail could not be sent, so no invitation was made. Try again in a moment.', 'mail_failed');
      }
      return dto({ ...inv, invitedBy: { name: actor.name } } as Invitation, now);
    },

    async revoke(studioId: number, invitationId: number): Promise<void> {
      const inv = await repo.findInStudio(studioId, invitationId);
      if (!inv) throw new NotFoundError('There is no such invitation in this studio.');
      if (inv.acceptedAt) throw new ConflictError('This invitation has already been accepted; remove the member instead.', 'invitation_used');
      if (inv.revokedAt) return;
      await repo.revoke(inv.id, ctx.clock.now());
    },

    async preview(token: string): Promise<InvitationPreview> {
      const inv = await usable(token);
      return {
        studioName: inv.studio.name,
        role: inv.role,
        email: inv.email,
        invitedBy: inv.invitedBy?.name ?? 'a former member',
        expiresAt: inv.expiresAt.toISOString(),
        accountExists: (await repo.userByEmail(inv.email)) !== null,
      };
    },

    /** Accepts; returns the id of the user who joined and whether the account is new. */
    async accept(actor: Actor | null, token: string, body: AcceptInvitationBody): Promise<{ userId: number; created: boolean }> {
      const inv = await usable(token);
      const existing = await repo.userByEmail(inv.email);
      assertCan(actor, 'invitation.accept', { invitedEmail: inv.email, accountExists: existing !== null });
      const now = ctx.clock.now();
      let outcome: number | 'spent' | 'member';
      if (actor) {
        outcome = await repo.accept(inv, { userId: actor.id }, now, inv.role);
      } else {
        const fields: Record<string, string> = {};
        if (!body.name) fields['body.name'] = 'Enter your name';
        if (!body.password) fields['body.password'] = 'Choose a password of at least 10 characters';
        if (Object.keys(fields).length > 0) throw new UnprocessableError('Enter your name and choose a password to create your account.', fields);
        const passwordHash = await hashPassword(body.password!);
        outcome = await repo.accept(inv, { newUser: { email: inv.email, name: body.name!, passwordHash } }, now, inv.role);
      }
      if (outcome === 'spent') throw new GoneError('This invitation has already been used.', 'invitation_used');
      if (outcome === 'member') throw new ConflictError(`You are already a member of ${inv.studio.name}.`, 'already_member');
      return { userId: outcome, created: actor === null };
    },
  };
}
