/**
 * Where a studio's logo lives and how pages link to it. Pure: the settings page, the header and
 * the logo route share these names.
 */

/** Largest logo file taken (2 MiB): a logo is a small picture; the stored copy is much smaller still. */
export const MAX_LOGO_UPLOAD_BYTES = 2 * 1024 * 1024;

/** The stored logo fits inside this square (pixels), keeping its proportions: twice the largest size it is shown at. */
export const LOGO_BOX = 256;

/** A stored logo's file name: a fresh UUID on every upload, so no cached copy of an older logo is shown. */
export const LOGO_FILE = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}\.png$/;

/** The object-store key of a studio's logo file. */
export const logoKey = (studioId: string, file: string) => `studios/${studioId}/logo/${file}`;

/** The app's link to a studio's logo, or null when it has none. */
export const logoUrl = (studioId: string, file: string | null | undefined) => (file ? `/logos/${studioId}/${file}` : null);
