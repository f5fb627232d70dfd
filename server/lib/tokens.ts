import { createHash, randomBytes } from 'node:crypto';

/** A URL-safe random token (256 bits) for links sent by e-mail. */
export const newToken = (): string => randomBytes(32).toString('base64url');

/** Tokens are stored only as their sha256, so a copied database holds no usable links. */
export const hashToken = (token: string): string => createHash('sha256').update(token, 'utf8').digest('hex');
