import { randomUUID } from 'node:crypto';
import { and, eq, ne, sql } from 'drizzle-orm';
import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand, type S3Client } from '@aws-sdk/client-s3';
import sharp from 'sharp';
import { studios, studioSlugRedirects } from '~/db/schema';
import type { StudioIdentityInput } from '~/lib/api/studio-schemas';
import { LOGO_BOX, LOGO_FILE, logoKey, logoUrl } from '~/lib/studios/studio-logo';
import { AppError, notFound } from '../errors';
import type { AppDeps } from '../app';
import { isUniqueViolation } from './accounts';

type Storage = { s3: S3Client; bucket: string };

/** A studio's name, address, colour and logo as its settings page and header show them. */
export interface StudioIdentity {
  id: string;
  name: string;
  slug: string;
  accentColour: string;
  logoUrl: string | null;
}

const SLUG_TAKEN = 'Another studio uses or used that address. Choose another one.';
export const slugTaken = () => new AppError('conflict', SLUG_TAKEN, { slug: SLUG_TAKEN });

/** Whether a slug is in use, now or before, by a studio other than `exceptStudioId` (old addresses keep redirecting, so they stay taken). */
export async function slugInUse(deps: AppDeps, slug: string, exceptStudioId: string | null = null): Promise<boolean> {
  const other = exceptStudioId ?? '00000000-0000-0000-0000-000000000000';
  const [row] = await deps.db
    .execute<{ taken: boolean }>(
      sql`select exists(select 1 from ${studios} where ${studios.slug} = ${slug} and ${studios.id} <> ${other})
        or exists(select 1 from ${studioSlugRedirects} where ${studioSlugRedirects.slug} = ${slug} and ${studioSlugRedirects.studioId} <> ${other}) as taken`,
    )
    .then((r) => r.rows);
  return !!row?.taken;
}

const identityOf = (row: typeof studios.$inferSelect): StudioIdentity => ({
  id: row.id,
  name: row.name,
  slug: row.slug,
  accentColour: row.accentColour,
  logoUrl: logoUrl(row.id, row.logoFile),
});

export async function getStudioIdentity(deps: AppDeps, studioId: string): Promise<StudioIdentity> {
  const row = await deps.db.query.studios.findFirst({ where: eq(studios.id, studioId) });
  if (!row) throw notFound('That studio');
  return identityOf(row);
}

/**
 * Renames the studio, moves it to a new address and recolours it. The address it leaves is kept
 * as a redirect to the studio (so shared links and e-mails keep working) and stays taken; a studio
 * may move back to one of its own old addresses. One transaction: a refusal changes nothing.
 */
export async function updateStudioIdentity(deps: AppDeps, studioId: string, input: StudioIdentityInput): Promise<StudioIdentity> {
  if (await slugInUse(deps, input.slug, studioId)) throw slugTaken();
  try {
    const row = await deps.db.transaction(async (tx) => {
      const [before] = await tx.select({ slug: studios.slug }).from(studios).where(eq(studios.id, studioId)).for('update');
      if (!before) throw notFound('That studio');
      if (before.slug !== input.slug) {
        await tx.delete(studioSlugRedirects).where(and(eq(studioSlugRedirects.slug, input.slug), eq(studioSlugRedirects.studioId, studioId)));
        await tx.insert(studioSlugRedirects).values({ slug: before.slug, studioId });
      }
      const [after] = await tx
        .update(studios)
        .set({ name: input.name, slug: input.slug, accentColour: input.accentColour })
        .where(eq(studios.id, studioId))
        .returning();
      return after!;
    });
    return identityOf(row);
  } catch (err) {
    // Another studio took the address between the check and the write: the unique indexes decide.
    if (isUniqueViolation(err)) throw slugTaken();
    throw err;
  }
}

/** Where an old address leads: the studio's current slug, or null when no studio ever used it. */
export async function slugRedirect(deps: AppDeps, oldSlug: string): Promise<string | null> {
  const [row] = await deps.db
    .select({ slug: studios.slug })
    .from(studioSlugRedirects)
    .innerJoin(studios, eq(studios.id, studioSlugRedirects.studioId))
    .where(and(eq(studioSlugRedirects.slug, oldSlug), ne(studios.slug, oldSlug)));
  return row?.slug ?? null;
}

const notALogo = () =>
  new AppError('unsupported_media', 'That file is not a PNG, JPEG or WebP picture we can read. Choose a logo saved as .png, .jpg or .webp and try again.', {
    logo: 'Choose a .png, .jpg or .webp picture.',
  });

/**
 * Stores an uploaded logo: the bytes decide what it is (never the name or declared type), only
 * PNG, JPEG and WebP are taken (no SVG: it can carry scripts), and it is scaled to fit inside
 * LOGO_BOX pixels and saved as PNG (transparency kept) under a new name. The old file is removed
 * after the studio points at the new one; nothing changes when any step refuses the file.
 */
export async function storeStudioLogo(deps: AppDeps, storage: Storage, studioId: string, bytes: Uint8Array): Promise<StudioIdentity> {
  const before = await deps.db.query.studios.findFirst({ where: eq(studios.id, studioId), columns: { logoFile: true } });
  if (!before) throw notFound('That studio');
  if (bytes.byteLength === 0) throw new AppError('invalid_input', 'The file is empty. Choose a .png, .jpg or .webp picture.', { logo: 'The file is empty.' });
  let png: Buffer;
  try {
    const image = sharp(bytes, { failOn: 'error', limitInputPixels: 40_000_000 });
    const { format } = await image.metadata();
    if (format !== 'png' && format !== 'jpeg' && format !== 'webp') throw notALogo();
    png = await image.rotate().resize(LOGO_BOX, LOGO_BOX, { fit: 'inside', withoutEnlargement: true }).png({ compressionLevel: 9 }).toBuffer();
  } catch (err) {
    if (err instanceof AppError) throw err;
    throw notALogo(); // sharp could not decode it: a broken or disguised file
  }
  const file = `${randomUUID()}.png`;
  await storage.s3.send(new PutObjectCommand({ Bucket: storage.bucket, Key: logoKey(studioId, file), Body: png, ContentType: 'image/png' }));
  return setLogo(deps, storage, studioId, file, before.logoFile);
}

/** Takes the logo off the studio's pages (the palette's mark shows again). */
export async function removeStudioLogo(deps: AppDeps, storage: Storage, studioId: string): Promise<StudioIdentity> {
  const before = await deps.db.query.studios.findFirst({ where: eq(studios.id, studioId), columns: { logoFile: true } });
  if (!before) throw notFound('That studio');
  return setLogo(deps, storage, studioId, null, before.logoFile);
}

async function setLogo(deps: AppDeps, storage: Storage, studioId: string, file: string | null, oldFile: string | null): Promise<StudioIdentity> {
  const [row] = await deps.db.update(studios).set({ logoFile: file }).where(eq(studios.id, studioId)).returning();
  if (oldFile && oldFile !== file) {
    // Best effort: a file left behind costs a few KB and is never linked again.
    await storage.s3.send(new DeleteObjectCommand({ Bucket: storage.bucket, Key: logoKey(studioId, oldFile) })).catch(() => undefined);
  }
  return identityOf(row!);
}

/** The logo's PNG bytes, when `file` is the studio's current logo (anything else is not there). */
export async function readStudioLogo(deps: AppDeps, storage: Storage, studioId: string, file: string): Promise<Uint8Array> {
  if (!LOGO_FILE.test(file)) throw notFound('That picture');
  const row = await deps.db.query.studios.findFirst({ where: eq(studios.id, studioId), columns: { logoFile: true } });
  if (!row || row.logoFile !== file) throw notFound('That picture');
  const object = await storage.s3.send(new GetObjectCommand({ Bucket: storage.bucket, Key: logoKey(studioId, file) }));
  return object.Body!.transformToByteArray();
}

/** What anyone may see of a studio: its public page, join page and header read this. */
export type PublicStudio = StudioIdentity;

/**
 * The studio an address `/s/{slug}` names: the studio, or where an old address now leads, or
 * nothing when no studio uses or used it.
 */
export async function studioAtAddress(deps: AppDeps, slug: string): Promise<{ studio: PublicStudio } | { movedTo: string } | null> {
  const row = await deps.db.query.studios.findFirst({ where: eq(studios.slug, slug) });
  if (row) return { studio: identityOf(row) };
  const movedTo = await slugRedirect(deps, slug);
  return movedTo ? { movedTo } : null;
}
