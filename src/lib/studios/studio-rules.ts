import Color from 'color';

/**
 * What a studio's address and accent colour must be. Pure: the start-a-studio form, the
 * settings form and the API all read these rules.
 */

/** Lower-case letters, digits and single dashes, 3–40 characters, starting and ending with a letter or digit. */
export const SLUG_PATTERN = /^[a-z0-9](?:[a-z0-9]|-(?=[a-z0-9])){2,39}$/;

/**
 * Addresses a studio cannot take: our own top-level routes (a studio's page lives at /s/{slug},
 * but a slug is also read in links and e-mails, so it must never look like one of ours), and
 * words people would take for the service itself.
 */
export const RESERVED_SLUGS: ReadonlySet<string> = new Set([
  'about', 'account', 'admin', 'api', 'app', 'assets', 'billing', 'classes', 'forgot-password', 'help',
  'invitations', 'join', 'library', 'login', 'logout', 'media', 'new', 'operator', 'reset-password',
  'roundmark', 'settings', 'sign-in', 'sign-out', 'sign-up', 'start', 'static', 'studio', 'studios',
  'support', 'verify-email', 'www',
]);

export type SlugProblem = 'shape' | 'reserved';

/** Why a slug cannot be used, or null when its form is fine (uniqueness is the database's to say). */
export function slugProblem(slug: string): SlugProblem | null {
  if (!SLUG_PATTERN.test(slug)) return 'shape';
  if (RESERVED_SLUGS.has(slug)) return 'reserved';
  return null;
}

export const SLUG_MESSAGES: Record<SlugProblem, string> = {
  shape: 'Use 3 to 40 lower-case letters, digits and single dashes, starting and ending with a letter or digit.',
  reserved: 'That address is reserved. Choose another one.',
};

/** The palette's text colours (../shared/design.md): chalk (white) and ink. */
export const TEXT_ON_ACCENT = { white: '#FFFFFF', ink: '#172033' } as const;

/** WCAG 2.2 success criterion 1.4.3 (contrast minimum, AA): 4.5:1 for normal-size text. */
export const AA_NORMAL_TEXT = 4.5;

export interface AccentVerdict {
  /** The text colour to put on the accent: the one with more contrast. */
  text: keyof typeof TEXT_ON_ACCENT;
  /** Contrast of that text on the accent, WCAG's (L1 + 0.05) / (L2 + 0.05). */
  ratio: number;
  ok: boolean;
}

/**
 * Whether text can sit on an accent colour: the accent is used behind button and badge text, in
 * white or ink, whichever contrasts more; it is refused when even that one is below WCAG 2.2 AA's
 * 4.5:1. (White and ink are 16.9:1 apart, so no colour gives both 4.5:1: one of them is enough.)
 */
export function accentVerdict(hex: string): AccentVerdict {
  const accent = Color(hex);
  const white = accent.contrast(Color(TEXT_ON_ACCENT.white));
  const ink = accent.contrast(Color(TEXT_ON_ACCENT.ink));
  const text = white >= ink ? 'white' : 'ink';
  const ratio = Math.max(white, ink);
  return { text, ratio, ok: ratio >= AA_NORMAL_TEXT };
}

/** A colour as the form's colour picker sends it: "#b93a17". */
export const HEX_COLOUR = /^#[0-9a-fA-F]{6}$/;
