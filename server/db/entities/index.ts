import { Brief, BriefChange } from './brief.js';
import { Feedback, Pin, PinAnchor, PinComment, Pinup, PinupEntry, ScoreSheet } from './critique.js';
import { Invitation } from './invitation.js';
import { MailMessage } from './mail-message.js';
import { Material } from './material.js';
import { Membership } from './membership.js';
import { NotificationLog, NotificationSetting } from './notification.js';
import { PasswordReset } from './password-reset.js';
import { Session } from './session.js';
import { Studio } from './studio.js';
import { Audit, Blob, CriticAssignment, Revision, RevisionFile, Submission } from './submission.js';
import { User } from './user.js';

export { Invitation, MailMessage, Membership, PasswordReset, Session, Studio, User };
export { Feedback, Pin, PinAnchor, PinComment, Pinup, PinupEntry, ScoreSheet };
export { Audit, Blob, Brief, BriefChange, CriticAssignment, Material, NotificationLog, NotificationSetting, Revision, RevisionFile, Submission };

/** Every entity, for the data source. */
export const ENTITIES = [
  User,
  Studio,
  Membership,
  Invitation,
  PasswordReset,
  MailMessage,
  Session,
  Material,
  Brief,
  BriefChange,
  Submission,
  Revision,
  Blob,
  RevisionFile,
  Audit,
  CriticAssignment,
  NotificationSetting,
  NotificationLog,
  Pin,
  PinAnchor,
  PinComment,
  Pinup,
  PinupEntry,
  ScoreSheet,
  Feedback,
];
