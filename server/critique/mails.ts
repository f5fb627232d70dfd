/**
 * The critique's e-mails, sent through the notifier (once per kind × person × subject, and
 * never to someone who turned the kind off) after the write has committed; a failed send is
 * logged and never fails the request.
 * - `pin-created` (subject: the pin): the submission's participant, when someone pins their revision.
 * - `pin-reply` (subject: the comment): the pin's author, everyone who commented before and the
 *   participant, never the one who replied.
 * - `feedback-released` (subject: the submission): the participant.
 * Comment text is quoted as typed (plain text; escaped in the HTML part, never rendered).
 */
import { PIN_CATEGORY_LABELS, type PinCategory } from '../../shared/api/critique.js';
import type { AppContext } from '../context.js';
import { rawDb } from '../db/raw.js';
import { escapeHtml, type MailAttachment } from '../mail/mail-service.js';
import { notifier, settingsLine } from '../notifications/service.js';

interface PinFacts {
  pin_id: number;
  number: number;
  category: PinCategory;
  submission_id: number;
  participant_id: number;
  participant_name: string;
  participant_email: string;
  brief_title: string;
  author_id: number | null;
}

/** Optional inline picture of the revision for the pin-created mail (PNG), or null. */
export type ThumbnailSource = (revisionId: number) => Promise<Buffer | null>;

const THUMBNAIL_CID = 'revision-thumbnail@planewright';

/** Plain-text paragraphs and one quoted comment as simple HTML (everything escaped). */
function html(parts: { before: string[]; quote?: string; after: string[]; link: { href: string; label: string }; imageCid?: string }): string {
  const p = (s: string) => `<p>${escapeHtml(s)}</p>`;
  const quote = parts.quote
    ? `<blockquote style="white-space: pre-wrap; border-left: 3px solid #999; margin: 0 0 1em; padding: 0 0 0 12px; color: #333;">${escapeHtml(parts.quote)}</blockquote>`
    : '';
  const img = parts.imageCid ? `<p><img src="cid:${parts.imageCid}" alt="The revision's model" width="320" style="max-width: 100%;"></p>` : '';
  return [
    '<!doctype html><html><body style="font-family: sans-serif; color: #222;">',
    ...parts.before.map(p),
    quote,
    img,
    `<p><a href="${escapeHtml(parts.link.href)}">${escapeHtml(parts.link.label)}</a></p>`,
    ...parts.after.map(p),
    '<p style="color:#666">— Planewright</p></body></html>',
  ].join('\n');
}

export function critiqueMails(ctx: AppContext, thumbnail?: ThumbnailSource) {
  const db = rawDb(ctx.dataSource);
  const notify = notifier(ctx);
  const log = ctx.logError ?? ((e: unknown) => console.error(e));
  const url = ctx.config.publicUrl;
  const name = (id: number | null): string => (id === null ? 'A former member' : ((db.prepare('SELECT name FROM users WHERE id = ?').get(id) as { name: string } | undefined)?.name ?? 'A former member'));

  function facts(pinId: number): PinFacts {
    return db
      .prepare(
        `SELECT p.id AS pin_id, p.number, p.category, p.submission_id, p.author_id, s.participant_id, u.name AS participant_name, u.email AS participant_email, b.title AS brief_title
           FROM pins p JOIN submissions s ON s.id = p.submission_id JOIN users u ON u.id = s.participant_id JOIN briefs b ON b.id = s.brief_id WHERE p.id = ?`,
      )
      .get(pinId) as PinFacts;
  }

  /** Where the pin is shown now: its last anchored revision. */
  function shownOn(pinId: number): { revisionId: number; revisionNumber: number; piece: string } {
    const r = db
      .prepare('SELECT a.revision_id, r.number, a.piece FROM pin_anchors a JOIN revisions r ON r.id = a.revision_id WHERE a.pin_id = ? ORDER BY r.number DESC LIMIT 1')
      .get(pinId) as { revision_id: number; number: number; piece: string };
    return { revisionId: r.revision_id, revisionNumber: r.number, piece: r.piece };
  }

  async function guarded(what: () => Promise<void>): Promise<void> {
    try {
      await what();
    } catch (e) {
      log(e);
    }
  }

  return {
    /** To the participant: a new pin on their revision, with its first comment. */
    pinCreated(pinId: number, body: string): Promise<void> {
      return guarded(async () => {
        const f = facts(pinId);
        if (f.author_id === f.participant_id) return;
        const at = shownOn(pinId);
        const link = `${url}/revisions/${at.revisionId}`;
        const category = PIN_CATEGORY_LABELS[f.category];
        const author = name(f.author_id);
        const intro = `${author} placed pin ${f.number} (${category}) on piece ${at.piece} of your revision ${at.revisionNumber} for "${f.brief_title}":`;
        let attachments: MailAttachment[] | undefined;
        if (thumbnail) {
          try {
            const png = await thumbnail(at.revisionId);
            if (png) attachments = [{ filename: `revision-${at.revisionNumber}.png`, content: png, contentType: 'image/png', cid: THUMBNAIL_CID }];
          } catch (e) {
            log(e);
          }
        }
        await notify.sendOnce('pin-created', f.participant_id, pinId, {
          to: f.participant_email,
          subject: `Pin ${f.number} on revision ${at.revisionNumber}: ${f.brief_title}`,
          text: `Hello ${f.participant_name},\n\n${intro}\n\n${body}\n\nOpen the revision: ${link}\n\n${settingsLine(url)}\n\n— Planewright\n`,
          html: html({
            before: [`Hello ${f.participant_name},`, intro],
            quote: body,
            after: [settingsLine(url)],
            link: { href: link, label: `Open revision ${at.revisionNumber}` },
            imageCid: attachments ? THUMBNAIL_CID : undefined,
          }),
          ...(attachments ? { attachments } : {}),
        });
      });
    },

    /** To the pin's author, earlier commenters and the participant (never the replier). */
    pinReply(pinId: number, commentId: number, replierId: number, body: string): Promise<void> {
      return guarded(async () => {
        const f = facts(pinId);
        const at = shownOn(pinId);
        const earlier = (db.prepare('SELECT DISTINCT author_id FROM pin_comments WHERE pin_id = ? AND id < ? AND author_id IS NOT NULL').all(pinId, commentId) as { author_id: number }[]).map((r) => r.author_id);
        const people = new Set<number>([...(f.author_id !== null ? [f.author_id] : []), ...earlier, f.participant_id]);
        people.delete(replierId);
        const link = `${url}/revisions/${at.revisionId}`;
        const category = PIN_CATEGORY_LABELS[f.category];
        const replier = name(replierId);
        for (const userId of people) {
          const u = db.prepare('SELECT name, email FROM users WHERE id = ?').get(userId) as { name: string; email: string } | undefined;
          if (!u) continue;
          const whose = userId === f.participant_id ? 'your revision' : `${f.participant_name}\u2019s revision`;
          const intro = `${replier} replied on pin ${f.number} (${category}, piece ${at.piece}) of ${whose} ${at.revisionNumber} for "${f.brief_title}":`;
          await notify.sendOnce('pin-reply', userId, commentId, {
            to: u.email,
            subject: `Reply on pin ${f.number}: ${f.brief_title}`,
            text: `Hello ${u.name},\n\n${intro}\n\n${body}\n\nOpen the thread: ${link}\n\n${settingsLine(url)}\n\n— Planewright\n`,
            html: html({ before: [`Hello ${u.name},`, intro], quote: body, after: [settingsLine(url)], link: { href: link, label: 'Open the thread' } }),
          });
        }
      });
    },

    /** To the participant: feedback and the final mark are released. */
    feedbackReleased(submissionId: number): Promise<void> {
      return guarded(async () => {
        const s = db
          .prepare(
            `SELECT s.participant_id, u.name, u.email, b.title, f.final_mark,
                    (SELECT id FROM revisions WHERE submission_id = s.id ORDER BY number DESC LIMIT 1) AS revision_id
               FROM submissions s JOIN users u ON u.id = s.participant_id JOIN briefs b ON b.id = s.brief_id JOIN feedback f ON f.submission_id = s.id WHERE s.id = ?`,
          )
          .get(submissionId) as { participant_id: number; name: string; email: string; title: string; final_mark: number; revision_id: number | null };
        const link = s.revision_id !== null ? `${url}/revisions/${s.revision_id}` : `${url}/submissions/${submissionId}`;
        const lines = [`Hello ${s.name},`, `The feedback on your work for "${s.title}" was released. Your final mark is ${s.final_mark} out of 100.`, 'The scores, the comments and the summary are on the revision page.'];
        await notify.sendOnce('feedback-released', s.participant_id, submissionId, {
          to: s.email,
          subject: `Feedback released: ${s.title}`,
          text: `${lines.join('\n\n')}\n\nRead the feedback: ${link}\n\n${settingsLine(url)}\n\n— Planewright\n`,
          html: html({ before: lines, after: [settingsLine(url)], link: { href: link, label: 'Read the feedback' } }),
        });
      });
    },
  };
}
export type CritiqueMails = ReturnType<typeof critiqueMails>;
