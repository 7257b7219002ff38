import { and, isNotNull, lte, sql } from 'drizzle-orm';
import { lessons } from '~/db/schema';
import { gateRefusal } from '~/lib/publishing/publish-gate';
import { AppError } from '../errors';
import type { AppDeps } from '../app';
import { gateLoaded, loadClass } from '../services/class-check';
import { libraryChanged } from '../services/library';
import { writeVersion } from '../services/publishing';
import { assertCan, type Actor } from './actor';

export interface PublishClassInput {
  lessonId: string;
  acknowledgeWarnings: boolean;
}

export interface PublishedVersion {
  versionId: string;
  number: number;
}

/**
 * Publishes the draft as a new immutable version (coach, owner): the timing check runs on the
 * state the transaction locked, errors block, warnings need the acknowledgement stored with the
 * version. The follow-up work (chapter thumbnails, the new-class e-mail, the library) is queued here.
 */
export async function publishClass(actor: Actor, deps: AppDeps, input: PublishClassInput): Promise<PublishedVersion> {
  assertCan(actor, 'class.publish');
  return publishAndFollowUp(deps, actor.studioId, input.lessonId, actor.userId, input.acknowledgeWarnings);
}

/**
 * Publishes every class whose scheduled time has come (the worker, once a minute). It is the
 * scheduled publish carried out: the owner's permission was checked when scheduling, and the
 * gate runs again now. A class that is not ready stays scheduled and is tried on the next run.
 */
export async function publishDueClasses(deps: AppDeps, now = new Date()): Promise<{ published: string[]; waiting: string[] }> {
  const due = await deps.db
    .select({ id: lessons.id, studioId: lessons.studioId, by: lessons.publishScheduledBy, ack: lessons.publishAcknowledgesWarnings })
    .from(lessons)
    .where(and(isNotNull(lessons.publishAt), lte(lessons.publishAt, now)));
  const published: string[] = [];
  const waiting: string[] = [];
  for (const l of due) {
    try {
      await publishAndFollowUp(deps, l.studioId, l.id, l.by, l.ack);
      published.push(l.id);
    } catch (err) {
      if (!(err instanceof AppError)) throw err;
      waiting.push(`${l.id}: ${err.message}`);
    }
  }
  return { published, waiting };
}

async function publishAndFollowUp(
  deps: AppDeps,
  studioId: string,
  lessonId: string,
  by: string | null,
  acknowledgeWarnings: boolean,
): Promise<PublishedVersion> {
  const published = await deps.db.transaction(async (tx) => {
    // Lock the class row first: two publishes cannot take the same version number, and a
    // timeline saved meanwhile waits, so the version holds exactly what the gate checked.
    await tx.execute(sql`select 1 from ${lessons} where ${lessons.id} = ${lessonId} and ${lessons.studioId} = ${studioId} for update`);
    const loaded = await loadClass(tx, studioId, lessonId);
    const { check, gate, gateInput } = gateLoaded(loaded);
    const refusal = gateRefusal(gate, gateInput, acknowledgeWarnings);
    if (refusal) {
      const extra =
        refusal.reason === 'errors'
          ? { findings: refusal.findings }
          : refusal.reason === 'needs-acknowledgement'
            ? { needsAcknowledgement: true, findings: refusal.findings }
            : undefined;
      throw new AppError('conflict', refusal.message, undefined, extra);
    }
    return writeVersion(tx, { ...loaded, plan: loaded.plan! }, check!, by, acknowledgeWarnings);
  });
  await deps.jobs('version.thumbnails', { versionId: published.versionId }, `version.thumbnails:${published.versionId}`);
  if (published.number === 1) {
    await deps.jobs('mail.class-published', { versionId: published.versionId }, `mail.class-published:${published.versionId}`);
  }
  await libraryChanged(deps, studioId);
  return published;
}
