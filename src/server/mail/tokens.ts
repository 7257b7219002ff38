import { createHash, randomBytes } from 'node:crypto';

/** A new secret for an e-mailed link: 256 random bits, URL-safe. Only its hash is stored. */
export function newToken(): string {
  return randomBytes(32).toString('base64url');
}

/** SHA-256 of a token as hex; what the database keeps, so a leaked table opens no accounts. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/** How long each kind of link works. */
export const TOKEN_LIFETIME = {
  verifyEmailHours: 48,
  resetPasswordMinutes: 60,
  invitationDays: 7,
} as const;
