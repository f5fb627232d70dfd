import { Invitation } from './invitation.js';
import { MailMessage } from './mail-message.js';
import { Membership } from './membership.js';
import { PasswordReset } from './password-reset.js';
import { Session } from './session.js';
import { Studio } from './studio.js';
import { User } from './user.js';

export { Invitation, MailMessage, Membership, PasswordReset, Session, Studio, User };

/** Every entity, for the data source. */
export const ENTITIES = [User, Studio, Membership, Invitation, PasswordReset, MailMessage, Session];
