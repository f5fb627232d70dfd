/**
 * Payloads of /api/me/notifications: which e-mails a person receives.
 */
import { z } from 'zod';

/** The e-mails Planewright sends about briefs, revisions and their critique. */
export const NOTIFICATION_KINDS = ['revision-received', 'brief-published', 'deadline-reminder', 'pin-created', 'pin-reply', 'feedback-released'] as const;
export const notificationKindSchema = z.enum(NOTIFICATION_KINDS);
export type NotificationKind = z.infer<typeof notificationKindSchema>;

/** What each kind is, for the settings screen. */
export const NOTIFICATION_LABELS: Readonly<Record<NotificationKind, string>> = {
  'revision-received': 'A revision of mine was received and audited (with the audit summary)',
  'brief-published': 'A brief was published in one of my studios',
  'deadline-reminder': 'A brief\u2019s deadline is 48 hours away (participants)',
  'pin-created': 'A critic or instructor pinned a comment on my revision',
  'pin-reply': 'Someone replied in a pin thread I am in',
  'feedback-released': 'Feedback and the final mark on my work were released',
};

/** `GET /api/me/notifications`: every kind with whether it is on (all on by default). */
export const notificationSettingsSchema = z.object({
  settings: z.array(z.object({ kind: notificationKindSchema, label: z.string(), enabled: z.boolean() })),
});
export type NotificationSettings = z.infer<typeof notificationSettingsSchema>;

/** `PUT /api/me/notifications`: kinds to switch on or off; kinds not named keep their setting. */
export const updateNotificationSettingsBodySchema = z.object({
  'revision-received': z.boolean().optional(),
  'brief-published': z.boolean().optional(),
  'deadline-reminder': z.boolean().optional(),
  'pin-created': z.boolean().optional(),
  'pin-reply': z.boolean().optional(),
  'feedback-released': z.boolean().optional(),
});
export type UpdateNotificationSettingsBody = z.infer<typeof updateNotificationSettingsBodySchema>;
